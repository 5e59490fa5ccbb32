import { plain, signed, signedPercent } from '@/lib/format-figures';
import type { RideComparisonView } from '@shared/schemas/submission-view';
import { formatClock, formatDuration } from '../lib/format';

// FIT battery_status values (FIT SDK profile), in our words.
const BATTERY_STATUS: Record<number, string> = { 1: 'new', 2: 'good', 3: 'fair', 4: 'low', 5: 'critical', 6: 'charging' };

const th = 'px-3 py-2 text-left text-caption font-semibold text-ink-soft';
const td = 'px-3 py-2 tabular-nums';

/** Drift of the difference over the ride, the temperature the head units recorded, and the meters' battery reports. */
export function RideConditions({ result, names }: { result: RideComparisonView; names: { a: string; b: string } }) {
  const { drift, temperature, battery } = result;
  const batteryRows = battery ? (['a', 'b'] as const).flatMap((side) => battery[side].map((reading) => ({ side, ...reading }))) : [];
  return (
    <div className="space-y-4 text-body">
      <p data-testid="ride-drift">
        {drift ? (
          <>
            Over {plain(drift.spanHours, 1)} h the difference moved by{' '}
            <strong className="tabular-nums">{signed(drift.percentPerHour, 1)} points per hour</strong>{' '}
            <span className="text-ink-soft tabular-nums">
              (95 % interval {plain(drift.lower, 1)} to {plain(drift.upper, 1)})
            </span>
            .{' '}
            {drift.lower > 0 || drift.upper < 0
              ? 'A steady meter keeps its difference level; a trend usually means a meter was not zeroed before the start or changes as it warms or cools.'
              : 'That is level within the noise of one ride.'}
          </>
        ) : (
          'The ride is too short (under four five-minute blocks) to tell whether the difference drifts.'
        )}
      </p>

      {temperature ? (
        <div className="space-y-2">
          <p>
            The head unit recorded{' '}
            <strong className="tabular-nums">
              {plain(temperature.minCelsius, 0)} to {plain(temperature.maxCelsius, 0)} °C
            </strong>{' '}
            (mean {plain(temperature.meanCelsius, 1)} °C).
          </p>
          <div className="overflow-x-auto rounded-lg border border-paper-line bg-white">
            <table className="w-full min-w-[16rem] text-caption">
              <caption className="sr-only">Bias of A against B in each temperature band of the ride</caption>
              <thead className="bg-paper-deep">
                <tr>
                  <th scope="col" className={th}>
                    Temperature
                  </th>
                  <th scope="col" className={`${th} text-right`}>
                    Time
                  </th>
                  <th scope="col" className={`${th} text-right`}>
                    A against B
                  </th>
                </tr>
              </thead>
              <tbody>
                {temperature.bands.map((band) => (
                  <tr key={band.band} className="border-t border-paper-line">
                    <th scope="row" className={`${td} text-left font-medium`}>
                      {band.band}
                    </th>
                    <td className={`${td} text-right`}>{formatDuration(band.seconds)}</td>
                    <td className={`${td} text-right font-semibold`}>{signedPercent(band.percent)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </div>
      ) : (
        <p className="text-ink-soft">Neither file records temperature.</p>
      )}

      {batteryRows.length > 0 && (
        <div className="space-y-1">
          <h3 className="text-body font-semibold">Battery reports</h3>
          <ul className="space-y-1 text-caption" aria-label="Battery reports">
            {batteryRows.map((row) => (
              <li key={`${row.side}:${row.atSeconds}`} className="tabular-nums">
                {row.atSeconds < 0 ? 'Before the shared part' : `At ${formatClock(row.atSeconds)}`}: {row.side === 'a' ? names.a : names.b}{' '}
                {row.status !== null ? `reports its battery ${BATTERY_STATUS[row.status] ?? 'in an unknown state'}` : 'reports its battery'}
                {row.volts !== null && ` (${plain(row.volts, 2)} V)`}
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
