import { useLocation } from 'react-router-dom';
import { RequireAccess } from '@/features/auth/components/require-access';
import { signInUrl } from '@/features/auth/sign-in-url';
import { SubmissionForm } from '@/features/submissions/components/submission-form';

export function SubmitRoute() {
  const location = useLocation();
  return (
    <RequireAccess>
      {() => (
        <div className="space-y-8">
          <header className="max-w-3xl space-y-3">
            <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Submit a ride</p>
            <h1 className="text-title font-semibold text-ink sm:text-display">Two meters, one ride</h1>
            <p className="text-lead text-ink-soft">
              Upload the two recordings of a ride you rode with two power meters on the bike, tell us which meters they were, and Crosswatt
              works out how closely they agree.
            </p>
          </header>
          <SubmissionForm signInHref={signInUrl(location.pathname)} />
        </div>
      )}
    </RequireAccess>
  );
}
