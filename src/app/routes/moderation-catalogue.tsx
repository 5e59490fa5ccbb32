import { CatalogueMerges } from '@/features/moderation/components/catalogue-merges';
import { ModerationPage } from '@/features/moderation/components/moderation-page';
import { PendingEntries } from '@/features/moderation/components/pending-entries';
import { getMakersQueryOptions } from '@/features/scoreboard/api/get-makers';
import { getScoreboardQueryOptions } from '@/features/scoreboard/api/get-scoreboard';
import { getCatalogueQueryOptions } from '@/features/submissions/api/get-catalogue';

export function ModerationCatalogueRoute() {
  return (
    <ModerationPage
      title="Catalogue proposals"
      intro="Makers, models, firmware versions and recording devices riders added. Their proposers can use them at once; everyone else sees them once approved."
    >
      <PendingEntries />
      <section aria-labelledby="approved-entries" className="space-y-3 border-t border-paper-line pt-8">
        <h2 id="approved-entries" className="text-lead font-semibold">
          Rename or merge approved entries
        </h2>
        <p className="max-w-2xl text-ink-soft">
          Two makers or recording devices that are the same thing: merge one into the other and its submissions and statistics move with it.
          Models and firmware versions are curated on their own pages.
        </p>
        <CatalogueMerges
          affects={[getScoreboardQueryOptions({}).queryKey, getMakersQueryOptions().queryKey, getCatalogueQueryOptions().queryKey]}
        />
      </section>
    </ModerationPage>
  );
}
