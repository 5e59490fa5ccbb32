import { Link } from 'react-router-dom';
import { RequireAccess } from '@/features/auth/components/require-access';
import { CatalogueMerges } from '@/features/moderation/components/catalogue-merges';
import { PendingEntries } from '@/features/moderation/components/pending-entries';
import { getMakersQueryOptions } from '@/features/scoreboard/api/get-makers';
import { getScoreboardQueryOptions } from '@/features/scoreboard/api/get-scoreboard';
import { getCatalogueQueryOptions } from '@/features/submissions/api/get-catalogue';

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
          <section aria-labelledby="approved-entries" className="space-y-3 border-t border-paper-line pt-8">
            <h2 id="approved-entries" className="text-lead font-semibold">
              Rename or merge approved entries
            </h2>
            <p className="max-w-2xl text-ink-soft">
              Two makers or recording devices that are the same thing: merge one into the other and its submissions and statistics move with it. Models and firmware versions are
              curated on their own pages.
            </p>
            <CatalogueMerges affects={[getScoreboardQueryOptions({}).queryKey, getMakersQueryOptions().queryKey, getCatalogueQueryOptions().queryKey]} />
          </section>
        </div>
      )}
    </RequireAccess>
  );
}
