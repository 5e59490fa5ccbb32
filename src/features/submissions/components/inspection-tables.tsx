import { signedPercent } from '@/lib/format-figures';
import type { CadenceStep } from '@shared/analysis/cadence-steps';
import type { DropoutRow } from '@shared/analysis/dropout-rows';
import type { Sprint } from '@shared/analysis/types';
import { formatClock, formatSignedSeconds, formatWatts } from '../lib/format';

const th = 'px-3 py-2 text-left text-caption font-semibold text-ink-soft';
const td = 'px-3 py-2 tabular-nums';
const jump =
  'font-semibold text-fjord-700 underline underline-offset-2 hover:text-fjord-900 focus-visible:outline focus-visible:outline-2 focus-visible:outline-fjord-500';

type Jump = (from: number, to: number) => void;

/** Each power dropout of either meter; its start jumps the chart there. */
export function DropoutTable({ rows, onJump }: { rows: DropoutRow[]; onJump: Jump }) {
  if (rows.length === 0) return <p className="text-caption text-ink-soft">Neither meter dropped out on this ride.</p>;
  return (
    <Frame
      caption="Power dropouts: meter, start, length, whether cadence vanished too and what the partner read meanwhile"
      minWidth="min-w-[26rem]"
    >
      <thead className="bg-paper-deep">
        <tr>
          <th scope="col" className={th}>
            Start
          </th>
          <th scope="col" className={th}>
            Meter
          </th>
          <th scope="col" className={`${th} text-right`}>
            Length
          </th>
          <th scope="col" className={th}>
            Cadence lost too
          </th>
          <th scope="col" className={`${th} text-right`}>
            Partner read
          </th>
        </tr>
      </thead>
      <tbody>
        {rows.map((row) => (
          <tr key={`${row.side}-${row.startSeconds}`} className="border-t border-paper-line">
            <td className={td}>
              <button
                type="button"
                className={jump}
                onClick={() => onJump(row.startSeconds, row.startSeconds + row.durationSeconds)}
                aria-label={`Show the dropout of ${row.side.toUpperCase()} at ${formatClock(row.startSeconds)}`}
              >
                {formatClock(row.startSeconds)}
              </button>
            </td>
            <td className={`${td} font-semibold ${row.side === 'a' ? 'text-ember-700' : 'text-moss-700'}`}>{row.side.toUpperCase()}</td>
            <td className={`${td} text-right`}>{row.durationSeconds} s</td>
            <td className={td}>{row.cadenceLostToo ? 'yes' : 'no'}</td>
            <td className={`${td} text-right`}>{formatWatts(row.partnerWatts)}</td>
          </tr>
        ))}
      </tbody>
    </Frame>
  );
}

/** Hard efforts found on B, each meter's peak and how fast it got to 80 % of it. */
export function SprintTable({ sprints, onJump }: { sprints: Sprint[]; onJump: Jump }) {
  if (sprints.length === 0)
    return <p className="text-caption text-ink-soft">No sprint on this ride (B above twice its average for 5 s or more).</p>;
  return (
    <Frame caption="Sprints: start, length, both peaks, their difference and seconds to 80 % of each peak" minWidth="min-w-[30rem]">
      <thead className="bg-paper-deep">
        <tr>
          <th scope="col" className={th}>
            Start
          </th>
          <th scope="col" className={`${th} text-right`}>
            Length
          </th>
          <th scope="col" className={`${th} text-right`}>
            Peak A
          </th>
          <th scope="col" className={`${th} text-right`}>
            Peak B
          </th>
          <th scope="col" className={`${th} text-right`}>
            A vs B
          </th>
          <th scope="col" className={`${th} text-right`}>
            To 80 %, A / B
          </th>
        </tr>
      </thead>
      <tbody>
        {sprints.map((s) => (
          <tr key={s.startSeconds} className="border-t border-paper-line">
            <td className={td}>
              <button
                type="button"
                className={jump}
                onClick={() => onJump(s.startSeconds, s.startSeconds + s.durationSeconds)}
                aria-label={`Show the sprint at ${formatClock(s.startSeconds)}`}
              >
                {formatClock(s.startSeconds)}
              </button>
            </td>
            <td className={`${td} text-right`}>{s.durationSeconds} s</td>
            <td className={`${td} text-right`}>{formatWatts(s.aPeakWatts)}</td>
            <td className={`${td} text-right`}>{formatWatts(s.bPeakWatts)}</td>
            <td className={`${td} text-right font-semibold`}>{signedPercent(s.percent)}</td>
            <td className={`${td} text-right`}>
              {formatSignedSeconds(s.aSecondsTo80Percent)} / {formatSignedSeconds(s.bSecondsTo80Percent)}
            </td>
          </tr>
        ))}
      </tbody>
    </Frame>
  );
}

const SHOWN_STEPS = 40;

/** Each detected cadence step: when each meter crossed halfway, and A's lag behind B. */
export function CadenceStepTable({ steps, onJump }: { steps: CadenceStep[]; onJump: Jump }) {
  const seconds = (v: number | null, at: number) => (v === null ? '–' : `${(v - at).toFixed(1)} s`);
  return (
    <>
      <Frame
        caption="Cadence steps: when, which way, the levels, each meter's crossing after the step and A's lag"
        minWidth="min-w-[30rem]"
      >
        <thead className="bg-paper-deep">
          <tr>
            <th scope="col" className={th}>
              At
            </th>
            <th scope="col" className={th}>
              Step
            </th>
            <th scope="col" className={`${th} text-right`}>
              A crossed
            </th>
            <th scope="col" className={`${th} text-right`}>
              B crossed
            </th>
            <th scope="col" className={`${th} text-right`}>
              Lag A − B
            </th>
          </tr>
        </thead>
        <tbody>
          {steps.slice(0, SHOWN_STEPS).map((s) => (
            <tr key={s.atSeconds} className="border-t border-paper-line">
              <td className={td}>
                <button
                  type="button"
                  className={jump}
                  onClick={() => onJump(Math.max(0, s.atSeconds - 10), s.atSeconds + 10)}
                  aria-label={`Show the cadence step at ${formatClock(s.atSeconds)}`}
                >
                  {formatClock(s.atSeconds)}
                </button>
              </td>
              <td className={td}>
                {s.direction === 'up' ? '↑' : '↓'} {Math.round(s.fromRpm)} → {Math.round(s.toRpm)} rpm
              </td>
              <td className={`${td} text-right`}>{seconds(s.aSeconds, s.atSeconds)}</td>
              <td className={`${td} text-right`}>{seconds(s.bSeconds, s.atSeconds)}</td>
              <td className={`${td} text-right font-semibold`}>
                {s.lagSeconds === null
                  ? '–'
                  : `${s.lagSeconds > 0 ? '+' : s.lagSeconds < 0 ? '−' : ''}${Math.abs(s.lagSeconds).toFixed(1)} s`}
              </td>
            </tr>
          ))}
        </tbody>
      </Frame>
      {steps.length > SHOWN_STEPS && (
        <p className="text-caption text-ink-soft">
          The first {SHOWN_STEPS} of {steps.length} steps.
        </p>
      )}
    </>
  );
}

function Frame({ caption, minWidth, children }: { caption: string; minWidth: string; children: React.ReactNode }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-paper-line bg-white">
      <table className={`w-full ${minWidth} text-caption`}>
        <caption className="sr-only">{caption}</caption>
        {children}
      </table>
    </div>
  );
}
