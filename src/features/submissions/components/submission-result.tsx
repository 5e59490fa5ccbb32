import type { ReactNode } from 'react';
import { METHOD_VERSION } from '@shared/analysis/method';
import type { RideComparisonView } from '@shared/schemas/submission-view';
import { BandBiasChart } from './band-bias-chart';
import { BlandAltmanChart } from './bland-altman-chart';
import { DifferenceChart } from './difference-chart';
import { FlagList } from './flag-list';
import { ResultHeadline } from './result-headline';
import { PeakPowerTable, SteadySegmentsTable } from './result-tables';
import { RideConditions } from './ride-conditions';
import { RideInspector } from './ride-inspector';

/** Everything the analysis found, figures first, then the pictures, then the tables. */
export function SubmissionResult({
  submissionId,
  result,
  names,
}: {
  submissionId: number;
  result: RideComparisonView;
  names: { a: string; b: string };
}) {
  return (
    <div className="space-y-10">
      <section aria-labelledby="headline-title" className="space-y-4">
        <h2 id="headline-title" className="text-title font-semibold">
          How closely the meters agreed
        </h2>
        <ResultHeadline result={result} />
      </section>

      <Block id="flags" title="Quality checks">
        {result.flags.length === 0 ? (
          <p className="rounded-lg border border-moss-500/30 bg-moss-100 p-3 text-caption text-ink">
            No quality problems found: the recordings line up well and look like one ride.
          </p>
        ) : (
          <FlagList flags={result.flags} />
        )}
      </Block>

      <Block
        id="inspect"
        title="Inspect the ride"
        lead="Both meters over each other, second by second. Drag across the chart, or type a start and an end, to read a section."
      >
        <RideInspector submissionId={submissionId} result={result} names={names} />
      </Block>

      <Block
        id="difference"
        title="The difference over the ride"
        lead="A minus B, averaged over short stretches. Shaded bands mark where a meter stopped reporting power."
      >
        <DifferenceChart result={result} />
      </Block>

      <Block
        id="conditions"
        title="Drift, temperature and batteries"
        lead="Does the difference creep during the ride, and does it change with the cold or the heat?"
      >
        <RideConditions result={result} names={names} />
      </Block>

      <Block
        id="agreement"
        title="Agreement, block by block"
        lead="A Bland–Altman plot: does the gap between the meters depend on how hard you pushed?"
      >
        <BlandAltmanChart agreement={result.agreement} />
      </Block>

      <div className="grid gap-10 lg:grid-cols-2">
        <Block id="power-bands" title="Bias by power band">
          <BandBiasChart bands={result.powerBands} />
        </Block>
        <Block id="cadence-bands" title="Bias by cadence band">
          <BandBiasChart bands={result.cadenceBands} />
        </Block>
      </div>

      <div className="grid gap-10 lg:grid-cols-2">
        <Block id="peaks" title="Peak power">
          <PeakPowerTable peaks={result.peaks} />
        </Block>
        <Block id="steady" title="Steady segments">
          <SteadySegmentsTable segments={result.steadySegments} />
        </Block>
      </div>
      <p className="text-caption text-ink-faint">
        Analysed with method version {result.methodVersion}.
        {result.methodVersion < METHOD_VERSION &&
          ` That is an older method: the current one is version ${METHOD_VERSION}, and these figures will change when the ride is re-analysed with it.`}
      </p>
    </div>
  );
}

function Block({ id, title, lead, children }: { id: string; title: string; lead?: string; children: ReactNode }) {
  return (
    // min-w-0 lets a grid column shrink below the width its chart was first drawn at.
    <section aria-labelledby={`${id}-title`} className="min-w-0 space-y-3">
      <div>
        <h2 id={`${id}-title`} className="text-lead font-semibold">
          {title}
        </h2>
        {lead && <p className="text-caption text-ink-soft">{lead}</p>}
      </div>
      {children}
    </section>
  );
}
