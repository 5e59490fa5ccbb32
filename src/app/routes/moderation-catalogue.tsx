import { Link } from 'react-router-dom';
import { RequireAccess } from '@/features/auth/components/require-access';
import { PendingEntries } from '@/features/moderation/components/pending-entries';

export function ModerationCatalogueRoute() {
  return (
    <RequireAccess roles={['moderator']}>
      {() => (
        <div className="space-y-6">
          <header className="flex flex-wrap items-end justify-between gap-3">
            <div>
              <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Moderation</p>
              <h1 className="text-title font-semibold">Catalogue proposals</h1>
              <p className="max-w-2xl text-ink-soft">Makers, models, firmware versions and recording devices riders added. Their proposers can use them at once; everyone else sees them once approved.</p>
            </div>
            <Link to="/moderation" className="text-fjord-700 underline underline-offset-4">
              Review queue
            </Link>
          </header>
          <PendingEntries />
        </div>
      )}
    </RequireAccess>
  );
}
