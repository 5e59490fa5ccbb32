import type { DropoutBreakdownRow } from '@shared/schemas/statistics';
import { NotEnoughData } from '@/components/ui/not-enough-data';
import { hours, pValue, perHour, ratio } from '@/lib/format-figures';

export function DropoutBreakdown({ rows }: { rows: DropoutBreakdownRow[] }) {
  if (rows.length === 0) return <p className="text-ink-soft">No accepted rides yet.</p>;
  return (
    <div className="overflow-x-auto rounded-card border border-paper-line bg-white shadow-card">
      <table className="w-full text-left text-body">
        <caption className="sr-only">Power dropouts split by the rides' tags, each against all other rides</caption>
        <thead className="border-b border-paper-line bg-paper-deep/60 text-caption uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="px-4 py-3">
              Rides tagged
            </th>
            <th scope="col" className="px-4 py-3">
              Rides · hours
            </th>
            <th scope="col" className="px-4 py-3">
              Power dropouts (95 %)
            </th>
            <th scope="col" className="px-4 py-3">
              Rate ratio vs the rest
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={`${row.tag}:${row.value}`} className="border-b border-paper-line/70 last:border-0">
              <th scope="row" className="px-4 py-2 font-normal">
                {row.label}
              </th>
              <td className="px-4 py-2 tabular-nums">
                {row.submissionCount} · {hours(row.pedallingHours)}
              </td>
              <td className="px-4 py-2 tabular-nums">
                {row.powerDropouts ? (
                  `${perHour(row.powerDropouts.perHour)} (${row.powerDropouts.lower.toFixed(2)} to ${row.powerDropouts.upper.toFixed(2)})`
                ) : (
                  <NotEnoughData />
                )}
              </td>
              <td className="px-4 py-2 tabular-nums">
                {row.againstRest ? (
                  <span className={row.againstRest.pValue < 0.05 ? 'font-semibold text-ember-700' : ''}>
                    {ratio(row.againstRest.ratio, row.againstRest.lower, row.againstRest.upper)}, {pValue(row.againstRest.pValue)}
                  </span>
                ) : (
                  <span className="text-caption text-ink-faint">no comparison</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
