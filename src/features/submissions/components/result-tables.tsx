import { signedPercent } from '@/lib/format-figures';
import type { Peaks, SteadySegment } from '@shared/analysis/types';
import { formatClock, formatDuration, formatWatts } from '../lib/format';

const th = 'px-3 py-2 text-left text-caption font-semibold text-ink-soft';
const td = 'px-3 py-2 tabular-nums';

/** Best average power over standard durations, as each meter saw it. */
export function PeakPowerTable({ peaks }: { peaks: Peaks }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-paper-line bg-white">
      <table className="w-full min-w-[18rem] text-caption">
        <caption className="sr-only">Peak power of A and B over standard durations</caption>
        <thead className="bg-paper-deep">
          <tr>
            <th scope="col" className={th}>
              Best over
            </th>
            <MeterColumns />
          </tr>
        </thead>
        <tbody>
          {peaks.best.map((p) => (
            <tr key={p.durationSeconds} className="border-t border-paper-line">
              <th scope="row" className={`${td} text-left font-medium`}>
                {formatDuration(p.durationSeconds)}
              </th>
              <td className={`${td} text-right`}>{formatWatts(p.aWatts)}</td>
              <td className={`${td} text-right`}>{formatWatts(p.bWatts)}</td>
              <td className={`${td} text-right font-semibold`}>{signedPercent(p.percent)}</td>
            </tr>
          ))}
          <tr className="border-t-2 border-paper-line">
            <th scope="row" className={`${td} text-left font-medium`}>
              Average
            </th>
            <td className={`${td} text-right`}>{formatWatts(peaks.averageWatts.a)}</td>
            <td className={`${td} text-right`}>{formatWatts(peaks.averageWatts.b)}</td>
            <td className={td} />
          </tr>
          <tr className="border-t border-paper-line">
            <th scope="row" className={`${td} text-left font-medium`}>
              Hard-effort weighted average
              <span className="block text-caption font-normal text-ink-faint">fourth-power mean of the 30-s rolling average</span>
            </th>
            <td className={`${td} text-right`}>{formatWatts(peaks.normalisedWatts.a)}</td>
            <td className={`${td} text-right`}>{formatWatts(peaks.normalisedWatts.b)}</td>
            <td className={td} />
          </tr>
        </tbody>
      </table>
    </div>
  );
}

/** Stretches of even riding, where the meters' disagreement is least muddied by lag and smoothing. */
export function SteadySegmentsTable({ segments }: { segments: SteadySegment[] }) {
  if (segments.length === 0) return <p className="text-caption text-ink-soft">This ride had no long stretch of steady power.</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-paper-line bg-white">
      <table className="w-full min-w-[20rem] text-caption">
        <caption className="sr-only">Steady segments: start, length, mean power of A and B and their difference</caption>
        <thead className="bg-paper-deep">
          <tr>
            <th scope="col" className={th}>
              From
            </th>
            <th scope="col" className={th}>
              Length
            </th>
            <MeterColumns />
          </tr>
        </thead>
        <tbody>
          {segments.map((s) => (
            <tr key={s.startSeconds} className="border-t border-paper-line">
              <td className={td}>{formatClock(s.startSeconds)}</td>
              <td className={td}>{formatDuration(s.durationSeconds)}</td>
              <td className={`${td} text-right`}>{formatWatts(s.aWatts)}</td>
              <td className={`${td} text-right`}>{formatWatts(s.bWatts)}</td>
              <td className={`${td} text-right font-semibold`}>{signedPercent(s.percent)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** The three columns both tables share: A's watts, B's watts and how far A reads from B. */
function MeterColumns() {
  return (
    <>
      <th scope="col" className={`${th} text-right`}>
        <span className="text-ember-700">A</span>
      </th>
      <th scope="col" className={`${th} text-right`}>
        <span className="text-moss-700">B</span>
      </th>
      <th scope="col" className={`${th} text-right`}>
        A vs B
      </th>
    </>
  );
}
