import { type FormEvent, useId, useState } from 'react';
import { addRidingInput, MAX_SELF_REPORTED_HOURS } from '@shared/schemas/battery';
import { useAddRiding } from '../api/add-riding';
import { fieldClass, labelClass, quietButton, today } from './equipment-parts';

/** Riding not submitted to Crosswatt, added by hand: counted towards the battery of its day, marked as self-reported. */
export function RidingForm({ meterId }: { meterId: number }) {
  const id = useId();
  const [riddenOn, setRiddenOn] = useState(today());
  const [hours, setHours] = useState('');
  const [problem, setProblem] = useState<string>();
  const add = useAddRiding();

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = addRidingInput.safeParse({ riddenOn, hours: Number(hours.replace(',', '.')) });
    if (!parsed.success) return setProblem(parsed.error.issues.map((i) => i.message).join('; '));
    setProblem(undefined);
    add.mutate({ meterId, ...parsed.data }, { onSuccess: () => setHours(''), onError: (error) => setProblem(error.message) });
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-wrap items-end gap-3" aria-label="Add riding by hand">
      <span className="flex flex-col gap-1">
        <label htmlFor={`${id}-day`} className={labelClass}>
          Ridden on (or up to)
        </label>
        <input
          id={`${id}-day`}
          type="date"
          max={today()}
          value={riddenOn}
          onChange={(e) => setRiddenOn(e.target.value)}
          className={fieldClass}
        />
      </span>
      <span className="flex flex-col gap-1">
        <label htmlFor={`${id}-hours`} className={labelClass}>
          Hours (at most {MAX_SELF_REPORTED_HOURS})
        </label>
        <input
          id={`${id}-hours`}
          inputMode="decimal"
          value={hours}
          onChange={(e) => setHours(e.target.value)}
          className={`${fieldClass} w-28`}
        />
      </span>
      <button type="submit" disabled={add.isPending} className={quietButton}>
        Add riding
      </button>
      {problem && (
        <p role="alert" className="w-full text-caption font-medium text-alert-800">
          {problem}
        </p>
      )}
    </form>
  );
}
