import { signedPercent } from '@/lib/format-figures';
import type { ReactNode } from 'react';
import type { RideComparisonView } from '@shared/schemas/submission-view';
import { formatDuration, formatLimitsOfAgreement, formatSignedSeconds } from '../lib/format';
import { LIKE_FOR_LIKE_LABELS } from '../lib/labels';

/** The handful of figures a rider reads first, each with its unit and its uncertainty. */
export function ResultHeadline({ result }: { result: RideComparisonView }) {
  const { agreement, dropouts, alignment, likeForLike } = result;
  const mode = LIKE_FOR_LIKE_LABELS[likeForLike.mode];
  return (
    <dl className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
      <Figure
        term="Bias, A against B"
        wide
        value={<span className="text-ember-700">{signedPercent(likeForLike.percent)}</span>}
        detail={
          <>
            Limits of agreement {formatLimitsOfAgreement(agreement.lowerLimitPercent, agreement.upperLimitPercent)} over{' '}
            {agreement.blockCount} blocks of {agreement.blockSeconds} s.
            {likeForLike.naivePercent != null && likeForLike.mode !== 'direct' && (
              <> Totals as recorded: {signedPercent(likeForLike.naivePercent)}.</>
            )}
          </>
        }
      />
      <Figure
        term="Dropouts"
        value={
          <span className="flex items-baseline gap-3">
            <span>
              <span className="mr-1 text-caption font-semibold text-ember-700">A</span>
              {dropouts.a.power.count}
            </span>
            <span>
              <span className="mr-1 text-caption font-semibold text-moss-700">B</span>
              {dropouts.b.power.count}
            </span>
          </span>
        }
        detail={`Power lost while pedalling: A ${formatDuration(dropouts.a.power.seconds)}, B ${formatDuration(dropouts.b.power.seconds)}. Cadence dropouts: A ${dropouts.a.cadence.count}, B ${dropouts.b.cadence.count}.`}
      />
      <Figure
        term="Clock offset"
        value={formatSignedSeconds(alignment.clockOffsetSeconds)}
        detail={`How far A's clock ran ahead of B's; found by lining up the power traces (r = ${alignment.correlation.toFixed(2)}). Shared riding: ${formatDuration(alignment.overlapSeconds)}.`}
      />
      <Figure
        term="Cadence lag"
        value={formatSignedSeconds(result.cadenceLagSeconds)}
        detail={
          result.cadenceLagSeconds == null
            ? 'Not enough cadence from both meters to measure it.'
            : 'How many seconds A reports cadence later than B, once the clocks are aligned.'
        }
      />
      <Figure term="Like-for-like" value={mode.title} detail={mode.text} />
    </dl>
  );
}

function Figure({ term, value, detail, wide }: { term: string; value: ReactNode; detail: ReactNode; wide?: boolean }) {
  return (
    <div
      className={`rounded-card border border-paper-line bg-white p-5 shadow-card ${wide ? 'sm:col-span-2 lg:col-span-1 lg:row-span-1' : ''}`}
    >
      <dt className="text-caption font-semibold uppercase tracking-wider text-ink-soft">{term}</dt>
      <dd className="mt-1 text-title font-semibold tabular-nums text-ink">{value}</dd>
      <dd className="mt-1.5 text-caption text-ink-soft">{detail}</dd>
    </div>
  );
}
