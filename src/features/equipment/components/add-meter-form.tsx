import { type FormEvent, useId, useState } from 'react';
import { BATTERY_TYPE_LABELS, BATTERY_TYPES, createRiderMeterInput } from '@shared/schemas/battery';
import type { Catalogue } from '@shared/schemas/catalogue';
import { useAddMeter } from '../api/add-meter';
import { fieldClass, labelClass, primaryButton } from './equipment-parts';

/** Adds one of the rider's meters: the model from the catalogue, how it is fitted, a name and its battery. */
export function AddMeterForm({ catalogue }: { catalogue: Pick<Catalogue, 'makers' | 'models'> }) {
  const id = useId();
  const [modelId, setModelId] = useState('');
  const [position, setPosition] = useState('');
  const [nickname, setNickname] = useState('');
  const [batteryType, setBatteryType] = useState('coin_cell');
  const [problem, setProblem] = useState<string>();
  const add = useAddMeter();
  const makers = new Map(catalogue.makers.map((m) => [m.id, m.name]));
  const models = [...catalogue.models].sort((x, y) =>
    `${makers.get(x.makerId)} ${x.name}`.localeCompare(`${makers.get(y.makerId)} ${y.name}`),
  );

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = createRiderMeterInput.safeParse({ modelId: Number(modelId), position, nickname, batteryType });
    if (!parsed.success) return setProblem(parsed.error.issues.map((i) => i.message).join('; '));
    setProblem(undefined);
    add.mutate(parsed.data, {
      onSuccess: () => {
        setNickname('');
        setModelId('');
        setPosition('');
      },
      onError: (error) => setProblem(error.message),
    });
  }

  return (
    <form onSubmit={submit} noValidate className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4 lg:items-end" aria-label="Add a meter">
      <span className="flex flex-col gap-1 sm:col-span-2">
        <label htmlFor={`${id}-model`} className={labelClass}>
          Power meter
        </label>
        <select
          id={`${id}-model`}
          value={modelId}
          onChange={(e) => {
            setModelId(e.target.value);
            setPosition(catalogue.models.find((m) => m.id === Number(e.target.value))?.position ?? '');
          }}
          className={fieldClass}
        >
          <option value="">Choose a model…</option>
          {models.map((m) => (
            <option key={m.id} value={m.id}>
              {makers.get(m.makerId)} {m.name}
            </option>
          ))}
        </select>
      </span>
      <span className="flex flex-col gap-1">
        <label htmlFor={`${id}-position`} className={labelClass}>
          Measures
        </label>
        <select id={`${id}-position`} value={position} onChange={(e) => setPosition(e.target.value)} className={fieldClass}>
          <option value="">Choose…</option>
          <option value="left">left only</option>
          <option value="right">right only</option>
          <option value="dual">both sides</option>
          <option value="total">total</option>
        </select>
      </span>
      <span className="flex flex-col gap-1">
        <label htmlFor={`${id}-battery`} className={labelClass}>
          Battery
        </label>
        <select id={`${id}-battery`} value={batteryType} onChange={(e) => setBatteryType(e.target.value)} className={fieldClass}>
          {BATTERY_TYPES.map((t) => (
            <option key={t} value={t}>
              {BATTERY_TYPE_LABELS[t]}
            </option>
          ))}
        </select>
      </span>
      <span className="flex flex-col gap-1 sm:col-span-2">
        <label htmlFor={`${id}-name`} className={labelClass}>
          Your name for it
        </label>
        <input
          id={`${id}-name`}
          value={nickname}
          maxLength={60}
          placeholder="e.g. winter bike, left crank"
          onChange={(e) => setNickname(e.target.value)}
          className={fieldClass}
        />
      </span>
      <div className="sm:col-span-2">
        <button type="submit" disabled={add.isPending} className={primaryButton}>
          Add this meter
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
