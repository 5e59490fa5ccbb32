import { Navigate, useParams } from 'react-router-dom';
import { PageSection as Section } from '@/components/ui/page-section';
import { getModelQueryOptions, useModel } from '@/features/models/api/get-model';
import { getModelConditionsQueryOptions, useModelConditions } from '@/features/models/api/get-model-conditions';
import { BatteryAndTemperature } from '@/features/models/components/battery-and-temperature';
import { DropoutBreakdown } from '@/features/models/components/dropout-breakdown';
import { FirmwareChart } from '@/features/models/components/firmware-chart';
import { FigureMethodsLine } from '@/features/models/components/figure-methods-line';
import { FirmwareComparisonTable } from '@/features/models/components/firmware-comparison-table';
import { HeadlineFigures } from '@/features/models/components/headline-figures';
import { ModelMasthead } from '@/features/models/components/model-masthead';
import { RecentSubmissions } from '@/features/models/components/recent-submissions';
import { ModeratorModelTools } from '@/features/moderation/components/moderator-model-tools';
import { getScoreboardQueryOptions } from '@/features/scoreboard/api/get-scoreboard';
import { ModelThreadSummary } from '@/features/threads/components/model-thread-summary';

export function ModelRoute() {
  const { slug = '' } = useParams();
  const model = useModel(slug);
  const conditions = useModelConditions(slug);
  if (model.isPending) return <p className="text-ink-soft">Loading…</p>;
  if (model.isError)
    return (
      <p role="alert" className="text-alert-800">
        {model.error.message}
      </p>
    );
  const page = model.data;
  // A merged model's old address answers with the model it became: show that address.
  if (page.model.slug !== slug) return <Navigate to={`/models/${page.model.slug}`} replace />;
  return (
    <div>
      <ModelMasthead model={page.model} note={page.note} />
      <ModeratorModelTools
        modelSlug={page.model.slug}
        note={page.note?.body ?? null}
        hiddenReason={page.model.hiddenReason}
        affects={[getModelQueryOptions(slug).queryKey, getScoreboardQueryOptions({}).queryKey]}
        batteryClaim={conditions.data?.claim ?? null}
        batteryAffects={[getModelConditionsQueryOptions(slug).queryKey]}
      />
      <div className="mt-8">
        <HeadlineFigures figures={page.figures} />
        <FigureMethodsLine methods={page.methods} />
      </div>
      <div className="mt-8">
        <ModelThreadSummary modelSlug={page.model.slug} />
      </div>
      <Section
        title="Across firmware versions"
        intro="Each version's bias and power dropout rate with their 95 % intervals; overlapping bars mean the data cannot tell the versions apart."
      >
        <FirmwareChart firmware={page.firmware} />
      </Section>
      <Section
        title="Each firmware against its predecessor"
        intro="Dropouts: the ratio of the two rates with an exact interval and p-value (conditional binomial test). Bias: the difference of the weighted means with Welch's t-test."
      >
        <FirmwareComparisonTable modelSlug={page.model.slug} firmware={page.firmware} />
      </Section>
      <Section
        title="What goes with dropouts"
        intro="Power dropouts split by how the rides were recorded, each compared with all the model's other rides."
      >
        <DropoutBreakdown rows={page.dropoutBreakdown} />
      </Section>
      <Section
        title="Battery and temperature"
        intro="Hours of riding per battery from riders' logs, each firmware against the one before, and the bias in each temperature band of the head unit."
      >
        <BatteryAndTemperature modelSlug={page.model.slug} />
      </Section>
      <Section title="Recent accepted rides">
        <RecentSubmissions submissions={page.recentSubmissions} />
      </Section>
    </div>
  );
}
