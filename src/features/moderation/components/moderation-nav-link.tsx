import { NavLink } from 'react-router-dom';
import { useMe } from '@/features/auth/api/get-me';

/** The header's way into the review queue, shown to moderators only (the API checks again). */
export function ModerationNavLink() {
  const me = useMe();
  if (!me.data?.roles.includes('moderator')) return null;
  return (
    <NavLink
      to="/moderation"
      className={({ isActive }) =>
        `shrink-0 whitespace-nowrap rounded-full px-3.5 py-1.5 text-caption font-medium transition-colors ${isActive ? 'bg-fjord-700 text-paper' : 'text-ink-soft hover:bg-paper-deep hover:text-ink'}`
      }
    >
      Review queue
    </NavLink>
  );
}
