import { formatDayAndTime } from '@/lib/format-date';
import { Link } from 'react-router-dom';
import { REJECT_REASON_LABELS } from '@shared/schemas/moderation';
import type { Review } from '@shared/schemas/moderation';

const SEVERITY_STYLE = {
  info: 'border-fjord-100 bg-white',
  warning: 'border-caution-600/40 bg-caution-100',
  severe: 'border-alert-600/40 bg-alert-100',
} as const;
const SEVERITY_WORD = { info: 'Note', warning: 'Check', severe: 'Problem' } as const;

function Panel({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="rounded-card border border-paper-line bg-white p-5 shadow-card" aria-label={title}>
      <h2 className="mb-3 text-lead font-semibold">{title}</h2>
      {children}
    </section>
  );
}

const SENT_BACK_BY_REANALYSIS = 'submission.sent_back_by_reanalysis';

/** When the last event was a re-analysis that put the ride back in the queue: its line ("Re-analysed with method N: …"). */
function reanalysisReason(review: Review): string | null {
  const last = review.history.at(-1);
  return last?.action === SENT_BACK_BY_REANALYSIS ? last.reason : null;
}

/** What only moderators see: the flags with what to check, the files against the tags, duplicates and the rider's record. */
export function ReviewEvidence({ review }: { review: Review }) {
  const history = review.riderHistory;
  const reanalysed = reanalysisReason(review);
  return (
    <div className="grid gap-5 lg:grid-cols-2">
      <Panel title="Flags and what to check">
        {reanalysed && (
          <p role="note" className="mb-3 rounded-lg border border-alert-600/40 bg-alert-100 p-3 text-caption font-semibold text-ink">
            Back in the queue. {reanalysed}
          </p>
        )}
        {review.flags.length === 0 ? (
          <p className="text-ink-soft">The analysis raised no flags.</p>
        ) : (
          <ul className="space-y-3">
            {review.flags.map((flag) => (
              <li key={flag.code} className={`rounded-lg border p-3 text-caption ${SEVERITY_STYLE[flag.severity]}`}>
                <p className="font-semibold">
                  {SEVERITY_WORD[flag.severity]}: {flag.message}
                </p>
                {flag.check && <p className="mt-1 text-ink-soft">{flag.check}</p>}
                {flag.likelyReason && (
                  <p className="mt-1 text-ink-soft">Usual reason if rejected: {REJECT_REASON_LABELS[flag.likelyReason].toLowerCase()}.</p>
                )}
              </li>
            ))}
          </ul>
        )}
      </Panel>

      <Panel title="The files against the tags">
        <ul className="space-y-2 text-caption">
          {review.deviceChecks.map((check) => (
            <li key={`${check.side}-${check.what}`} className="flex gap-2">
              <span
                aria-hidden="true"
                className={check.agrees === false ? 'text-alert-600' : check.agrees ? 'text-moss-700' : 'text-ink-faint'}
              >
                {check.agrees === false ? '✗' : check.agrees ? '✓' : '?'}
              </span>
              <span className={check.agrees === false ? 'font-semibold text-alert-800' : ''}>{check.message}</span>
            </li>
          ))}
        </ul>
        <p className="mt-3 text-caption text-ink-soft">
          {review.originals
            .map((o) => `File ${o.side.toUpperCase()}: ${o.kept ? 'original kept (location removed)' : 'original not kept, streams only'}`)
            .join(' · ')}
        </p>
      </Panel>

      <Panel title="Possible duplicates">
        {review.duplicates.length === 0 ? (
          <p className="text-caption text-ink-soft">No other submission covers the same time.</p>
        ) : (
          <ul className="space-y-2 text-caption">
            {review.duplicates.map((d) => (
              <li key={d.id} className={d.nearIdentical ? 'font-semibold text-alert-800' : ''}>
                <Link to={`/moderation/submissions/${d.id}`} className="text-fjord-700 underline underline-offset-2">
                  #{d.id}
                </Link>{' '}
                by {d.riderHandle ?? 'deleted rider'} ({d.status.replace(/_/g, ' ')}): {Math.round(d.overlapShare * 100)} % of the ride
                overlaps, {Math.round(d.sameStreamShare * 100)} % of the power readings are the same
                {d.nearIdentical ? ' — looks like the same ride uploaded again.' : '.'}
              </li>
            ))}
          </ul>
        )}
      </Panel>

      <Panel title="The rider's record">
        <dl className="grid grid-cols-2 gap-3 text-caption">
          {(
            [
              ['Accepted', history.accepted],
              ['Rejected', history.rejected],
              ['Sent back', history.sentBack],
              ['Withdrawn', history.withdrawn],
            ] as const
          ).map(([term, count]) => (
            <div key={term} className="rounded-lg bg-paper-deep p-3">
              <dt className="text-ink-soft">{term}</dt>
              <dd className="text-title font-semibold tabular-nums">{count}</dd>
            </div>
          ))}
        </dl>
        {review.history.length > 0 && (
          <ol className="mt-4 space-y-1 text-caption text-ink-soft">
            {review.history.map((h) => (
              <li key={h.id}>
                {h.action === SENT_BACK_BY_REANALYSIS ? (
                  `${formatDayAndTime(h.createdAt)}: ${h.reason ?? 'back to review after a re-analysis'}`
                ) : (
                  <>
                    {formatDayAndTime(h.createdAt)}: {h.action.replace('submission.', '').replace(/_/g, ' ')} by{' '}
                    {h.actorHandle ?? 'someone'}
                    {h.reason ? ` (${h.reason})` : ''}
                  </>
                )}
              </li>
            ))}
          </ol>
        )}
      </Panel>
    </div>
  );
}
