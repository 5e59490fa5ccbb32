import { Link } from 'react-router-dom';
import { RequireAccess } from '@/features/auth/components/require-access';
import { MySubmissionsList } from '@/features/submissions/components/my-submissions-list';

export function MySubmissionsRoute() {
  return (
    <RequireAccess>
      {() => (
        <div className="space-y-6">
          <header className="flex flex-wrap items-end justify-between gap-4">
            <div>
              <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Your rides</p>
              <h1 className="text-title font-semibold text-ink">My submissions</h1>
            </div>
            <Link to="/submit" className="rounded-full bg-ember-700 px-5 py-2 font-semibold text-paper hover:bg-ember-900">
              Submit a ride
            </Link>
          </header>
          <MySubmissionsList />
        </div>
      )}
    </RequireAccess>
  );
}
