import type { QueryKey } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { useHideModel } from '../api/hide-model';
import { ActionError, dangerButton, inputClass, primaryButton } from './curation-parts';

/** Hide a model from the scoreboard with a reason everyone sees on its page, or show it again. */
export function ScoreboardVisibilityForm({
  modelId,
  hiddenReason,
  affects,
}: {
  modelId: number;
  hiddenReason: string | null;
  affects: QueryKey[];
}) {
  const fieldId = useId();
  const [reason, setReason] = useState('');
  const visibility = useHideModel(affects);
  if (hiddenReason) {
    return (
      <div className="space-y-2">
        <p className="text-ink">
          Hidden from the scoreboard, because: <q>{hiddenReason}</q> Its page and figures stay reachable by link.
        </p>
        <ActionError error={visibility.error} />
        <button
          type="button"
          disabled={visibility.isPending}
          onClick={() => visibility.mutate({ modelId, reason: null })}
          className={primaryButton}
        >
          Show it on the scoreboard again
        </button>
      </div>
    );
  }
  return (
    <form
      onSubmit={(event) => {
        event.preventDefault();
        visibility.mutate({ modelId, reason }, { onSuccess: () => setReason('') });
      }}
      className="space-y-2"
    >
      <span className="flex flex-col gap-1">
        <label htmlFor={fieldId} className="text-caption font-medium text-ink">
          Why it leaves the scoreboard (shown on its page)
        </label>
        <input
          id={fieldId}
          required
          minLength={3}
          maxLength={280}
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          className={`${inputClass} w-full max-w-2xl`}
        />
      </span>
      <ActionError error={visibility.error} />
      <button type="submit" disabled={visibility.isPending} className={dangerButton}>
        Hide from the scoreboard
      </button>
    </form>
  );
}
