import type { SubmissionRecording } from '../api/get-submission';
import { POSITION_LABELS, RECORDING_MODE_LABELS, ZERO_OFFSET_LABELS } from '../lib/labels';

const SIDE_STYLE = {
  a: { bar: 'border-l-ember-500', badge: 'bg-ember-700', role: 'Judged' },
  b: { bar: 'border-l-moss-500', badge: 'bg-moss-700', role: 'Partner' },
} as const;

/** What the rider told us about each meter, side by side. */
export function RecordingSummary({ recordings }: { recordings: SubmissionRecording[] }) {
  return (
    <div className="grid gap-4 md:grid-cols-2">
      {recordings.map((r) => {
        const style = SIDE_STYLE[r.side];
        return (
          <article key={r.side} className={`rounded-card border border-l-4 border-paper-line bg-white p-5 shadow-card ${style.bar}`}>
            <div className="flex items-center gap-3">
              <span
                aria-hidden="true"
                className={`grid h-8 w-8 shrink-0 place-items-center rounded-full font-bold text-paper ${style.badge}`}
              >
                {r.side.toUpperCase()}
              </span>
              <div>
                <p className="text-caption font-semibold uppercase tracking-wider text-ink-soft">
                  <span className="sr-only">Meter {r.side.toUpperCase()}, </span>
                  {style.role}
                </p>
                <h3 className="font-semibold leading-tight text-ink">
                  {r.makerName} {r.modelName}
                </h3>
              </div>
            </div>
            <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-caption">
              <dt className="text-ink-soft">Firmware</dt>
              <dd className="font-medium">{r.firmwareVersion}</dd>
              <dt className="text-ink-soft">Measures</dt>
              <dd>{POSITION_LABELS[r.position]}</dd>
              <dt className="text-ink-soft">Recorded with</dt>
              <dd>
                {r.recordingDeviceName}
                {r.recordingDeviceFirmware && ` (${r.recordingDeviceFirmware})`}, {RECORDING_MODE_LABELS[r.recordingMode].toLowerCase()}
              </dd>
              <dt className="text-ink-soft">Zero offset</dt>
              <dd>{ZERO_OFFSET_LABELS[r.zeroOffset]}</dd>
              <dt className="text-ink-soft">Other meters on</dt>
              <dd>{r.otherMetersOn ? 'Yes' : 'No'}</dd>
            </dl>
          </article>
        );
      })}
    </div>
  );
}
