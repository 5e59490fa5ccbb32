import { Link } from 'react-router-dom';
import { AccountSettingsForm } from '@/features/account/components/account-settings-form';
import { DeleteAccountForm } from '@/features/account/components/delete-account-form';
import { RequireAccess } from '@/features/auth/components/require-access';
import { MySubmissionsList } from '@/features/submissions/components/my-submissions-list';

export function AccountRoute() {
  return (
    <RequireAccess>
      {(me) => (
        <div className="max-w-3xl space-y-10">
          <header className="space-y-1">
            <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Your account</p>
            <h1 className="text-title font-semibold">{me.name}</h1>
            <p className="text-ink-soft">
              @{me.handle}
              {me.email && ` · ${me.email}`} · {me.roles.join(', ')}
              {me.makers.length > 0 && ` · verified staff of ${me.makers.map((m) => m.name).join(', ')}`}
            </p>
          </header>
          <section aria-labelledby="profile" className="space-y-4 rounded-card border border-paper-line bg-white/70 p-6 shadow-card">
            <h2 id="profile" className="text-lead font-semibold">
              Profile and e-mail
            </h2>
            <AccountSettingsForm me={me} />
          </section>
          <section aria-labelledby="my-submissions" className="space-y-3 rounded-card border border-paper-line bg-white/70 p-6 shadow-card">
            <h2 id="my-submissions" className="text-lead font-semibold">
              My submissions
            </h2>
            <MySubmissionsList />
          </section>
          <section aria-labelledby="my-meters" className="space-y-2 rounded-card border border-paper-line bg-white/70 p-6 shadow-card">
            <h2 id="my-meters" className="text-lead font-semibold">
              My meters and their batteries
            </h2>
            <p className="text-ink-soft">
              Log battery changes and riding per meter on{' '}
              <Link to="/my-equipment" className="text-fjord-700 underline">
                My meters
              </Link>
              : they count towards each model's battery life.
            </p>
          </section>
          <section aria-labelledby="delete" className="space-y-4 rounded-card border border-alert-100 bg-white/70 p-6 shadow-card">
            <h2 id="delete" className="text-lead font-semibold text-alert-800">
              Delete my account
            </h2>
            <DeleteAccountForm handle={me.handle} />
          </section>
        </div>
      )}
    </RequireAccess>
  );
}
