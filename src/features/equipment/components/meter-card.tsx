import { Link } from 'react-router-dom';
import { BATTERY_TYPE_LABELS, PREVIOUS_BATTERY_ENDING_LABELS, type RiderMeterView } from '@shared/schemas/battery';
import { formatDay } from '@/lib/format-date';
import { useRemoveBatteryEvent } from '../api/remove-battery-event';
import { useRemoveMeter } from '../api/remove-meter';
import { BatteryEventForm } from './battery-event-form';
import { quietButton } from './equipment-parts';
import { RidingForm } from './riding-form';

const POSITION_WORDS = { left: 'left only', right: 'right only', dual: 'both sides', total: 'total' } as const;

function batteryState(ended: boolean, toDay: string | null) {
  if (toDay === null) return <span className="rounded-full bg-fjord-50 px-2 text-caption text-fjord-700">still running</span>;
  return ended ? (
    <span className="rounded-full bg-ember-50 px-2 text-caption text-ember-700">ran flat</span>
  ) : (
    <span className="text-caption text-ink-faint">changed early</span>
  );
}

/** One of the rider's meters: its batteries with their hours, the log of changes, and forms to add to it. */
export function MeterCard({ meter, firmware }: { meter: RiderMeterView; firmware: { id: number; version: string }[] }) {
  const removeEvent = useRemoveBatteryEvent();
  const removeMeter = useRemoveMeter();
  const rechargeable = meter.batteryType === 'rechargeable';
  const headingId = `meter-${meter.id}`;
  return (
    <section
      aria-labelledby={headingId}
      className="space-y-5 rounded-card border border-paper-line bg-white/80 p-5 shadow-card sm:p-6"
      data-testid="meter-card"
    >
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 id={headingId} className="text-lead font-semibold text-ink">
            {meter.nickname}
          </h2>
          <p className="text-ink-soft">
            <Link to={`/models/${meter.model.slug}`} className="text-fjord-700 hover:underline">
              {meter.model.makerName} {meter.model.name}
            </Link>{' '}
            · {POSITION_WORDS[meter.position]} · {BATTERY_TYPE_LABELS[meter.batteryType]}
          </p>
        </div>
        <button
          type="button"
          className={quietButton}
          disabled={removeMeter.isPending}
          onClick={() => {
            if (window.confirm(`Remove “${meter.nickname}” and its battery log? Its batteries leave the battery-life figures.`))
              removeMeter.mutate(meter.id);
          }}
        >
          Remove meter
        </button>
      </header>

      {!meter.ridesAttributed && (
        <p className="rounded-lg bg-caution-100 px-3 py-2 text-caption text-caution-600">
          You have two meters of this model measuring the same way, so your submitted rides cannot be told apart: only riding you add by
          hand counts towards their batteries.
        </p>
      )}

      {meter.batteries.length === 0 ? (
        <p className="text-ink-soft">No battery logged yet. Log the battery that is in the meter now, from the day it went in.</p>
      ) : (
        <>
          {/* On a phone each battery is a short paragraph; from the small breakpoint up, a table. */}
          <ul className="space-y-2 sm:hidden" aria-label={`Batteries of ${meter.nickname}`}>
            {[...meter.batteries].reverse().map((b) => (
              <li key={b.fromDay} className="rounded-lg border border-paper-line/70 px-3 py-2">
                <div className="flex flex-wrap items-center justify-between gap-2">
                  <span className="font-medium text-ink">
                    {formatDay(b.fromDay)} – {b.toDay ? formatDay(b.toDay) : 'now'}
                  </span>
                  {batteryState(b.ended, b.toDay)}
                </div>
                <p className="text-caption text-ink-soft">
                  firmware {b.firmwareVersion} · {b.submittedHours.toFixed(1)} h submitted · {b.selfReportedHours.toFixed(1)} h
                  self-reported
                </p>
              </li>
            ))}
          </ul>
          <div className="hidden overflow-x-auto sm:block">
            <table className="w-full text-left text-body">
              <caption className="sr-only">Batteries of {meter.nickname}</caption>
              <thead className="text-caption uppercase tracking-wide text-ink-soft">
                <tr className="border-b border-paper-line">
                  <th scope="col" className="py-2 pr-4">
                    Battery
                  </th>
                  <th scope="col" className="py-2 pr-4">
                    Firmware
                  </th>
                  <th scope="col" className="py-2 pr-4">
                    Submitted rides
                  </th>
                  <th scope="col" className="py-2 pr-4">
                    Added by hand
                  </th>
                  <th scope="col" className="py-2">
                    State
                  </th>
                </tr>
              </thead>
              <tbody>
                {[...meter.batteries].reverse().map((b) => (
                  <tr key={b.fromDay} className="border-b border-paper-line/60 last:border-0">
                    <th scope="row" className="py-2 pr-4 font-medium">
                      {formatDay(b.fromDay)} – {b.toDay ? formatDay(b.toDay) : 'now'}
                    </th>
                    <td className="py-2 pr-4">{b.firmwareVersion}</td>
                    <td className="py-2 pr-4 tabular-nums">{b.submittedHours.toFixed(1)} h</td>
                    <td className="py-2 pr-4 tabular-nums">
                      {b.selfReportedHours.toFixed(1)} h <span className="text-caption text-ink-faint">self-reported</span>
                    </td>
                    <td className="py-2">{batteryState(b.ended, b.toDay)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      )}

      <details className="rounded-lg border border-paper-line/80 p-3">
        <summary className="cursor-pointer font-medium text-ink">Log of changes ({meter.events.length})</summary>
        <ul className="mt-2 space-y-1">
          {meter.events.map((e) => (
            <li key={e.id} className="flex flex-wrap items-center gap-x-3 text-body text-ink-soft">
              <span className="font-medium text-ink">{formatDay(e.occurredOn)}</span>
              <span>
                {e.kind === 'recharged' ? 'recharged' : 'new battery'} on {e.firmwareVersion}; before:{' '}
                {PREVIOUS_BATTERY_ENDING_LABELS[e.previousEnded]}
              </span>
              <button
                type="button"
                className="text-caption text-alert-800 underline"
                disabled={removeEvent.isPending}
                onClick={() => removeEvent.mutate({ meterId: meter.id, eventId: e.id })}
              >
                remove
              </button>
            </li>
          ))}
        </ul>
      </details>

      <BatteryEventForm meterId={meter.id} rechargeable={rechargeable} firmware={firmware} isFirst={meter.events.length === 0} />
      <RidingForm meterId={meter.id} />
    </section>
  );
}
