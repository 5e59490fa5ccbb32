import { Link, useNavigate } from 'react-router-dom';
import { initials } from '@shared/initials';
import { useMe } from '../api/get-me';
import { useSignOut } from '../api/sign-out';
import { signInUrl } from '../sign-in-url';

/** The header's right-hand side: Sign in for visitors; name, Account, Admin and Sign out for people. */
export function UserMenu() {
  const me = useMe();
  const navigate = useNavigate();
  const signOut = useSignOut({ onSuccess: () => navigate('/') });

  if (me.isPending) return <span className="text-caption text-ink-faint">…</span>;
  if (!me.data) {
    return (
      <a
        href={signInUrl(window.location.pathname)}
        className="rounded-full bg-fjord-700 px-4 py-1.5 text-caption font-medium text-paper hover:bg-fjord-900"
      >
        Sign in
      </a>
    );
  }
  const user = me.data;
  return (
    <nav className="flex items-center gap-2" aria-label="Your account">
      {user.roles.includes('admin') && (
        <Link
          to="/admin/users"
          className="rounded-full px-3 py-1.5 text-caption font-medium text-ink-soft hover:bg-paper-deep hover:text-ink"
        >
          Admin
        </Link>
      )}
      <Link
        to="/my-submissions"
        className="hidden rounded-full px-3 py-1.5 text-caption font-medium text-ink-soft hover:bg-paper-deep hover:text-ink sm:inline"
      >
        My rides
      </Link>
      <Link
        to="/my-equipment"
        className="hidden rounded-full px-3 py-1.5 text-caption font-medium text-ink-soft hover:bg-paper-deep hover:text-ink sm:inline"
      >
        My meters
      </Link>
      <Link to="/account" className="flex items-center gap-2 rounded-full py-1 pl-1 pr-3 hover:bg-paper-deep" data-testid="signed-in-as">
        <span
          aria-hidden="true"
          className="grid h-7 w-7 place-items-center rounded-full bg-ember-100 text-caption font-semibold text-ember-900"
        >
          {initials(user.name)}
        </span>
        <span className="max-w-[9rem] truncate text-caption font-medium text-ink">{user.name}</span>
      </Link>
      <button
        type="button"
        onClick={() => signOut.mutate()}
        disabled={signOut.isPending}
        className="rounded-full border border-paper-line px-3 py-1.5 text-caption font-medium text-ink-soft hover:border-fjord-300 hover:text-ink"
      >
        Sign out
      </button>
    </nav>
  );
}
