import type { QueryKey } from '@tanstack/react-query';
import { useId, useState } from 'react';
import type { CatalogueEntryType } from '@shared/schemas/moderation';
import { useCurateEntry } from '../api/curate-entry';
import { ActionDone, ActionError, inputClass, primaryButton } from './curation-parts';

/** Renames an approved entry; the server keeps the old name as an alias that still finds it. */
export function RenameForm({
  type,
  entry,
  affects,
  label = 'New name',
}: {
  type: CatalogueEntryType;
  entry: { id: number; name: string };
  affects: QueryKey[];
  label?: string;
}) {
  const fieldId = useId();
  const [name, setName] = useState(entry.name);
  const [renamedFrom, setRenamedFrom] = useState<string | null>(null);
  const rename = useCurateEntry({ affects });
  function submit(event: React.FormEvent) {
    event.preventDefault();
    setRenamedFrom(null);
    rename.mutate(
      { kind: 'curate', type, id: entry.id, input: { action: 'rename', name } },
      { onSuccess: () => setRenamedFrom(entry.name) },
    );
  }
  return (
    <form onSubmit={submit} className="space-y-2">
      <div className="flex flex-wrap items-end gap-3">
        <span className="flex flex-col gap-1">
          <label htmlFor={fieldId} className="text-caption font-medium text-ink">
            {label}
          </label>
          <input
            id={fieldId}
            required
            maxLength={80}
            value={name}
            onChange={(e) => setName(e.target.value)}
            className={`${inputClass} w-72`}
          />
        </span>
        <button type="submit" disabled={rename.isPending || name.trim() === entry.name} className={primaryButton}>
          Rename
        </button>
      </div>
      <p className="text-caption text-ink-soft">The old name stays as an alias, so searches and old links still find it.</p>
      <ActionError error={rename.error} />
      {renamedFrom && (
        <ActionDone>
          Renamed: “{renamedFrom}” is now “{name.trim()}”, and the old name still finds it.
        </ActionDone>
      )}
    </form>
  );
}
