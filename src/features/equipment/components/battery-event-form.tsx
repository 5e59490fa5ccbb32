import { type FormEvent, useId, useState } from 'react';
import { createBatteryEventInput, PREVIOUS_BATTERY_ENDING_LABELS, PREVIOUS_BATTERY_ENDINGS } from '@shared/schemas/battery';
import { useAddBatteryEvent } from '../api/add-battery-event';
import { fieldClass, labelClass, primaryButton, today } from './equipment-parts';

/** Logs a battery change or recharge: the day, why the one before came out, and the firmware the meter runs. */
export function BatteryEventForm({
  meterId,
  rechargeable,
  firmware,
  isFirst,
}: {
  meterId: number;
  rechargeable: boolean;
  firmware: { id: number; version: string }[];
  isFirst: boolean;
}) {
  const id = useId();
  const [occurredOn, setOccurredOn] = useState(today());
  const [previousEnded, setPreviousEnded] = useState<string>(isFirst ? 'first_battery' : 'ran_flat');
  const [firmwareId, setFirmwareId] = useState(String(firmware.at(-1)?.id ?? ''));
  const [problem, setProblem] = useState<string>();
  const add = useAddBatteryEvent();

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = createBatteryEventInput.safeParse({
      occurredOn,
      kind: rechargeable ? 'recharged' : 'changed',
      previousEnded,
      firmwareId: Number(firmwareId),
    });
    if (!parsed.success) return setProblem(parsed.error.issues.map((i) => i.message).join('; '));
    setProblem(undefined);
    add.mutate({ meterId, ...parsed.data }, { onError: (error) => setProblem(error.message) });
  }

  return (
    <form
      onSubmit={submit}
      noValidate
      className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4 lg:items-end"
      aria-label={rechargeable ? 'Log a recharge' : 'Log a battery change'}
    >
      <span className="flex flex-col gap-1">
        <label htmlFor={`${id}-day`} className={labelClass}>
          {rechargeable ? 'Recharged on' : 'New battery on'}
        </label>
        <input
          id={`${id}-day`}
          type="date"
          max={today()}
          value={occurredOn}
          onChange={(e) => setOccurredOn(e.target.value)}
          className={fieldClass}
        />
      </span>
      <span className="flex flex-col gap-1">
        <label htmlFor={`${id}-ended`} className={labelClass}>
          The one before came out because
        </label>
        <select id={`${id}-ended`} value={previousEnded} onChange={(e) => setPreviousEnded(e.target.value)} className={fieldClass}>
          {PREVIOUS_BATTERY_ENDINGS.map((e) => (
            <option key={e} value={e}>
              {PREVIOUS_BATTERY_ENDING_LABELS[e]}
            </option>
          ))}
        </select>
      </span>
      <span className="flex flex-col gap-1">
        <label htmlFor={`${id}-firmware`} className={labelClass}>
          Firmware on the meter
        </label>
        <select id={`${id}-firmware`} value={firmwareId} onChange={(e) => setFirmwareId(e.target.value)} className={fieldClass}>
          {firmware.map((f) => (
            <option key={f.id} value={f.id}>
              {f.version}
            </option>
          ))}
        </select>
      </span>
      <div>
        <button type="submit" disabled={add.isPending} className={primaryButton}>
          {rechargeable ? 'Log the recharge' : 'Log the change'}
        </button>
      </div>
      {problem && (
        <p role="alert" className="text-caption font-medium text-alert-800 sm:col-span-2 lg:col-span-4">
          {problem}
        </p>
      )}
    </form>
  );
}
