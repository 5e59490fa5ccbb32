import type { ConsensusFigure, MeterFigures } from '@shared/schemas/statistics';
import { IntervalBar } from '@/components/ui/interval-bar';
import { NotEnoughData } from '@/components/ui/not-enough-data';
import { formatDay } from '@/lib/format-date';
import { hours, percentPlusMinus, percentRange, perHour, seconds, signedPercent } from '@/lib/format-figures';

function Figure({ label, children, note }: { label: string; children: React.ReactNode; note?: string }) {
  return (
    <div className="rounded-card border border-paper-line bg-white p-4 shadow-card">
      <dt className="text-caption font-medium uppercase tracking-wide text-ink-soft">{label}</dt>
      <dd className="mt-1 text-lead font-semibold tabular-nums text-ink">{children}</dd>
      {note && <dd className="mt-1 text-caption text-ink-faint">{note}</dd>}
    </div>
  );
}

export function HeadlineFigures({
  figures,
  consensus,
  consensusFit,
}: {
  figures: MeterFigures;
  consensus?: ConsensusFigure | null;
  /** The fit the offset comes from: its day, and whether a refit after a newer decision is under way. */
  consensusFit?: { fittedOn: string | null; refitPending: boolean };
}) {
  const fitNote = consensusFit
    ? `${consensusFit.fittedOn ? `; fitted ${formatDay(consensusFit.fittedOn)}` : ''}${consensusFit.refitPending ? '; a refit with the newest decisions is under way' : ''}`
    : '';
  const { evidence, bias, agreement, powerDropouts, cadenceDropouts, sprints } = figures;
  return (
    <dl className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
      <Figure label="Evidence" note={`${Math.round(evidence.likeForLikeShare * 100)} % like-for-like comparisons`}>
        {evidence.submissionCount} rides · {evidence.distinctRiders} riders · {hours(evidence.pedallingHours)}
      </Figure>
      <Figure
        label="Bias against partners"
        note={
          bias
            ? `95 % interval over ${bias.riders} riders ${percentRange(bias.lowerPercent, bias.upperPercent)}; median ${bias.medianPercent === null ? '—' : signedPercent(bias.medianPercent)}`
            : undefined
        }
      >
        {bias ? (
          <span className="flex flex-col gap-1.5">
            <span className="whitespace-nowrap">{percentPlusMinus(bias.meanPercent, bias.lowerPercent, bias.upperPercent)}</span>
            <IntervalBar mean={bias.meanPercent} lower={bias.lowerPercent} upper={bias.upperPercent} />
          </span>
        ) : (
          <NotEnoughData riders />
        )}
      </Figure>
      <Figure
        label="Ride-to-ride scatter"
        note={
          agreement ? `Pooled limits of agreement ${percentRange(agreement.lowerPercent, agreement.upperPercent)} (30 s blocks)` : undefined
        }
      >
        {bias ? `${bias.scatterPercent.toFixed(1)} % SD` : <NotEnoughData riders />}
      </Figure>
      <Figure
        label="Power dropouts"
        note={
          powerDropouts
            ? `${powerDropouts.events} events; 95 % interval ${powerDropouts.lower.toFixed(2)} to ${powerDropouts.upper.toFixed(2)} /h${rateMethodNote(powerDropouts.method)}`
            : undefined
        }
      >
        {powerDropouts ? perHour(powerDropouts.perHour) : <NotEnoughData riders />}
      </Figure>
      <Figure
        label="Cadence dropouts"
        note={
          cadenceDropouts
            ? `95 % interval ${cadenceDropouts.lower.toFixed(2)} to ${cadenceDropouts.upper.toFixed(2)} /h${rateMethodNote(cadenceDropouts.method)}`
            : undefined
        }
      >
        {cadenceDropouts ? perHour(cadenceDropouts.perHour) : <NotEnoughData riders />}
      </Figure>
      <Figure label="Cadence lag (median)" note="Positive: this meter's cadence arrives later than its partner's.">
        {figures.enough && figures.medianCadenceLagSeconds !== null ? seconds(figures.medianCadenceLagSeconds) : <NotEnoughData />}
      </Figure>
      <Figure
        label="Sprints against partners"
        note={
          sprints?.meanRiseSecondsVsPartner != null
            ? `Reaches 80 % of its peak ${seconds(sprints.meanRiseSecondsVsPartner)} relative to the partner`
            : undefined
        }
      >
        {sprints?.meanPeakPercent != null ? (
          `${signedPercent(sprints.meanPeakPercent)} peak over ${sprints.count} sprints`
        ) : (
          <NotEnoughData />
        )}
      </Figure>
      {consensus !== undefined && (
        <Figure
          label="Offset from crowd consensus"
          note={`${consensus ? `Compared with ${consensus.connectedTo} other meters like for like` : 'Needs like-for-like comparisons with at least 2 other meters'}${fitNote}`}
        >
          {consensus ? (
            consensus.lowerPercent !== null && consensus.upperPercent !== null ? (
              percentPlusMinus(consensus.offsetPercent, consensus.lowerPercent, consensus.upperPercent)
            ) : (
              signedPercent(consensus.offsetPercent)
            )
          ) : (
            <NotEnoughData />
          )}
        </Figure>
      )}
    </dl>
  );
}

/** Says which interval a rate shows (see the methodology page). */
const rateMethodNote = (method: 'rider_clustered' | 'poisson_exact') =>
  method === 'rider_clustered' ? ', widened because riders differ' : ', exact Poisson';
