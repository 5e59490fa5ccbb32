import type { QueryKey } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { batteryClaimInput } from '@shared/schemas/battery';
import { useSetBatteryClaim } from '../api/set-battery-claim';
import { ActionDone, ActionError, inputClass, primaryButton, quietButton } from './curation-parts';

/** The maker's claimed hours per battery, with where the maker says so; shown beside the riders' figure. */
export function BatteryClaimForm({
  modelId,
  current,
  affects,
}: {
  modelId: number;
  current: { hours: number; source: string } | null;
  affects: QueryKey[];
}) {
  const hoursId = useId();
  const sourceId = useId();
  const [hours, setHours] = useState(current ? String(current.hours) : '');
  const [source, setSource] = useState(current?.source ?? '');
  const [problem, setProblem] = useState<string>();
  const claim = useSetBatteryClaim(affects);
  return (
    <form
      noValidate
      onSubmit={(event) => {
        event.preventDefault();
        const parsed = batteryClaimInput.safeParse({ hours: Number(hours), source });
        if (!parsed.success) return setProblem(parsed.error.issues[0]?.message);
        setProblem(undefined);
        claim.mutate({ modelId, ...parsed.data });
      }}
      className="flex flex-wrap items-end gap-3"
    >
      <span className="flex flex-col gap-1">
        <label htmlFor={hoursId} className="text-caption font-medium text-ink">
          Claimed hours per battery
        </label>
        <input id={hoursId} inputMode="decimal" value={hours} onChange={(e) => setHours(e.target.value)} className={`${inputClass} w-32`} />
      </span>
      <span className="flex min-w-64 flex-1 flex-col gap-1">
        <label htmlFor={sourceId} className="text-caption font-medium text-ink">
          Where the maker says so
        </label>
        <input
          id={sourceId}
          maxLength={300}
          value={source}
          onChange={(e) => setSource(e.target.value)}
          className={`${inputClass} w-full`}
        />
      </span>
      <button type="submit" disabled={claim.isPending} className={primaryButton}>
        Save the claim
      </button>
      {current && (
        <button
          type="button"
          disabled={claim.isPending}
          onClick={() => claim.mutate({ modelId, hours: null, source: null })}
          className={quietButton}
        >
          Clear it
        </button>
      )}
      <div className="w-full">
        {problem && (
          <p role="alert" className="text-caption font-medium text-alert-800">
            {problem}
          </p>
        )}
        <ActionError error={claim.error} />
        {claim.isSuccess && <ActionDone>Saved.</ActionDone>}
      </div>
    </form>
  );
}
