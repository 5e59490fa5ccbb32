import type { QueryKey } from '@tanstack/react-query';
import { useId, useState } from 'react';
import type { CatalogueEntryType } from '@shared/schemas/moderation';
import type { MergeResult } from '@shared/schemas/moderation';
import { useCurateEntry } from '../api/curate-entry';
import { ActionError, dangerButton, inputClass, primaryButton, quietButton } from './curation-parts';
import { EntryPicker, type PickableEntry } from './entry-picker';

const WHAT_MOVES: Record<CatalogueEntryType, (from: string) => string> = {
  maker: (from) => `the models of “${from}” (same-named models are merged too), their submissions and statistics, and its staff`,
  model: (from) => `the firmware versions of “${from}” (same versions are merged too), all its submissions and their statistics`,
  firmware: (from) => `all submissions tagged “${from}” and their statistics`,
  recording_device: (from) => `all recordings tagged “${from}”, and the dropout figures that depend on them`,
};

/**
 * Merges `from` into an entry picked from `targets`, after a confirmation that
 * says what moves and that the old name stays as an alias. Merging cannot be
 * undone from the browser.
 */
export function MergeForm({
  type,
  from,
  targets,
  targetLabel,
  affects,
  onMerged,
}: {
  type: CatalogueEntryType;
  from: { id: number; name: string };
  targets: PickableEntry[];
  targetLabel: string;
  affects: QueryKey[];
  onMerged?: (into: PickableEntry, result: MergeResult) => void;
}) {
  const reasonId = useId();
  const [intoId, setIntoId] = useState<number | null>(null);
  const [reason, setReason] = useState('');
  const [confirming, setConfirming] = useState(false);
  const [merged, setMerged] = useState<{ into: PickableEntry; result: MergeResult } | null>(null);
  const merge = useCurateEntry({ affects });
  const into = targets.find((t) => t.id === intoId) ?? null;

  function review(event: React.FormEvent) {
    event.preventDefault();
    if (into) setConfirming(true);
  }
  function confirm() {
    if (!into) return;
    // The promise, not mutate's callbacks: the panel may unmount once the merged
    // entry drops out of the catalogue, and the page must still move on.
    merge.mutateAsync({ kind: 'merge', type, id: from.id, input: { intoId: into.id, reason } }).then(
      (result) => {
        setConfirming(false);
        setMerged({ into, result: result as MergeResult });
        onMerged?.(into, result as MergeResult);
      },
      () => {}, // shown from merge.error
    );
  }

  if (merged) {
    return (
      <p role="status" className="rounded-lg bg-moss-100 px-3 py-2 text-caption font-medium text-moss-700">
        Merged “{from.name}” into “{merged.into.name}”: {merged.result.movedRecordings} recordings moved,{' '}
        {merged.result.movedAcceptedSubmissions} accepted submissions counted again. The old name stays as an alias.
      </p>
    );
  }
  return (
    <form onSubmit={review} className="space-y-3">
      <EntryPicker
        label={targetLabel}
        entries={targets.filter((t) => t.id !== from.id)}
        value={intoId}
        onChange={(id) => {
          setIntoId(id);
          setConfirming(false);
        }}
      />
      <span className="flex flex-col gap-1">
        <label htmlFor={reasonId} className="text-caption font-medium text-ink">
          Why they are the same (kept in the audit log)
        </label>
        <input
          id={reasonId}
          required
          minLength={3}
          maxLength={1000}
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          className={`${inputClass} w-full max-w-2xl`}
        />
      </span>
      {!confirming && (
        <button type="submit" disabled={!into} className={primaryButton}>
          Review the merge…
        </button>
      )}
      {confirming && into && (
        <div
          role="alertdialog"
          aria-labelledby={`${reasonId}-confirm`}
          className="max-w-2xl space-y-3 rounded-card border border-caution-600 bg-caution-100 p-4"
        >
          <p id={`${reasonId}-confirm`} className="font-semibold text-ink">
            Merge “{from.name}” into “{into.name}”?
          </p>
          <ul className="list-disc space-y-1 pl-5 text-ink">
            <li>
              “{into.name}” takes over {WHAT_MOVES[type](from.name)}.
            </li>
            <li>
              “{from.name}” leaves the catalogue; its name stays as an alias that still finds “{into.name}”.
            </li>
            <li>This cannot be undone here.</li>
          </ul>
          <div className="flex flex-wrap gap-2">
            {/* biome-ignore lint/a11y/noAutofocus: the confirmation step replaces the button just pressed, so focus moves to its first action */}
            <button type="button" autoFocus disabled={merge.isPending} onClick={confirm} className={dangerButton}>
              {merge.isPending ? 'Merging…' : `Merge into “${into.name}”`}
            </button>
            <button type="button" disabled={merge.isPending} onClick={() => setConfirming(false)} className={quietButton}>
              Cancel
            </button>
          </div>
        </div>
      )}
      <ActionError error={merge.error} />
    </form>
  );
}
