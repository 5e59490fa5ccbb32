import { Navigate, useParams } from 'react-router-dom';
import { PageSection as Section } from '@/components/ui/page-section';
import { useFirmware } from '@/features/models/api/get-firmware';
import { getModelQueryOptions } from '@/features/models/api/get-model';
import { DropoutBreakdown } from '@/features/models/components/dropout-breakdown';
import { FigureMethodsLine } from '@/features/models/components/figure-methods-line';
import { FirmwareComparisonTable } from '@/features/models/components/firmware-comparison-table';
import { BatteryAndTemperature } from '@/features/models/components/battery-and-temperature';
import { HeadlineFigures } from '@/features/models/components/headline-figures';
import { ModelMasthead } from '@/features/models/components/model-masthead';
import { RecentSubmissions } from '@/features/models/components/recent-submissions';
import { ModeratorFirmwareTools } from '@/features/moderation/components/moderator-firmware-tools';
import { getScoreboardQueryOptions } from '@/features/scoreboard/api/get-scoreboard';

export function FirmwareRoute() {
  const { slug = '', version = '' } = useParams();
  const firmware = useFirmware(slug, version);
  if (firmware.isPending) return <p className="text-ink-soft">Loading…</p>;
  if (firmware.isError)
    return (
      <p role="alert" className="text-alert-800">
        {firmware.error.message}
      </p>
    );
  const page = firmware.data;
  // A merged version's old address answers with the version it became: show that address.
  if (page.model.slug !== slug || page.firmware.version !== version) {
    return <Navigate to={`/models/${page.model.slug}/firmware/${page.firmware.version}`} replace />;
  }
  return (
    <div>
      <ModelMasthead model={page.model} note={page.note} firmware={page.firmware.version} />
      <ModeratorFirmwareTools
        modelSlug={page.model.slug}
        version={page.firmware.version}
        note={page.note?.body ?? null}
        affects={[getModelQueryOptions(slug).queryKey, getScoreboardQueryOptions({}).queryKey]}
      />
      <div className="mt-8">
        <HeadlineFigures
          figures={page.firmware.figures}
          consensus={page.firmware.consensus}
          consensusFit={{ fittedOn: page.consensusFittedOn, refitPending: page.consensusRefitPending }}
        />
        <FigureMethodsLine methods={page.methods} />
      </div>
      <Section title="Against the previous firmware">
        <FirmwareComparisonTable modelSlug={page.model.slug} firmware={[page.firmware]} />
      </Section>
      <Section
        title="What goes with dropouts"
        intro="Power dropouts on this firmware split by how the rides were recorded, each against the other rides on this firmware."
      >
        <DropoutBreakdown rows={page.dropoutBreakdown} />
      </Section>
      <Section
        title="Battery and temperature"
        intro="How long a battery lasts on this version, from riders' logs, and the bias in each temperature band of the head unit."
      >
        <BatteryAndTemperature modelSlug={page.model.slug} version={page.firmware.version} />
      </Section>
      <Section title="Accepted rides on this firmware">
        <RecentSubmissions submissions={page.submissions} />
      </Section>
    </div>
  );
}
