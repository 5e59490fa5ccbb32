import { useState } from 'react';
import type { CatalogueEntryType } from '@shared/schemas/moderation';
import { useCurateEntry } from '../api/curate-entry';
import type { PendingEntry } from '@shared/schemas/moderation';
import { usePendingEntries } from '../api/get-pending-entries';

const GROUPS: Array<{ key: 'makers' | 'models' | 'firmware' | 'recordingDevices'; type: CatalogueEntryType; title: string }> = [
  { key: 'makers', type: 'maker', title: 'Makers' },
  { key: 'models', type: 'model', title: 'Models' },
  { key: 'firmware', type: 'firmware', title: 'Firmware versions' },
  { key: 'recordingDevices', type: 'recording_device', title: 'Recording devices' },
];

/** Entries riders proposed, waiting for a moderator: approve, rename, reject with a reason, or merge into an existing entry. */
export function PendingEntries() {
  const pending = usePendingEntries();
  const curate = useCurateEntry();
  if (pending.isPending)
    return (
      <p className="text-ink-soft" role="status">
        Loading proposals…
      </p>
    );
  if (pending.isError)
    return (
      <p className="text-alert-800" role="alert">
        The proposals could not be loaded: {pending.error.message}
      </p>
    );
  const total = GROUPS.reduce((sum, g) => sum + pending.data[g.key].length, 0);
  return (
    <div className="space-y-6">
      {curate.isError && (
        <p role="alert" className="rounded-lg bg-alert-100 p-3 font-medium text-alert-800">
          {curate.error.message}
        </p>
      )}
      {total === 0 && (
        <p className="rounded-card border border-dashed border-paper-line p-8 text-center text-ink-soft">No proposals are waiting.</p>
      )}
      {GROUPS.filter((g) => pending.data[g.key].length > 0).map((group) => (
        <section key={group.key} aria-label={group.title} className="space-y-3">
          <h2 className="text-lead font-semibold">{group.title}</h2>
          <ul className="space-y-3">
            {pending.data[group.key].map((entry) => (
              <PendingRow
                key={entry.id}
                type={group.type}
                entry={entry}
                onAction={(action) => curate.mutate(action)}
                busy={curate.isPending}
              />
            ))}
          </ul>
        </section>
      ))}
    </div>
  );
}

function PendingRow({
  type,
  entry,
  onAction,
  busy,
}: {
  type: CatalogueEntryType;
  entry: PendingEntry;
  onAction: (a: Parameters<ReturnType<typeof useCurateEntry>['mutate']>[0]) => void;
  busy: boolean;
}) {
  const [mode, setMode] = useState<'rename' | 'reject' | 'merge' | null>(null);
  const [text, setText] = useState('');
  const [intoId, setIntoId] = useState('');
  const context = [entry.makerName, entry.modelName].filter(Boolean).join(' ');
  function submit(event: React.FormEvent) {
    event.preventDefault();
    if (mode === 'rename') onAction({ kind: 'curate', type, id: entry.id, input: { action: 'rename', name: text } });
    if (mode === 'reject') onAction({ kind: 'curate', type, id: entry.id, input: { action: 'reject', reason: text } });
    if (mode === 'merge') onAction({ kind: 'merge', type, id: entry.id, input: { intoId: Number(intoId), reason: text } });
  }
  return (
    <li className="rounded-card border border-paper-line bg-white p-4 shadow-card">
      <div className="flex flex-wrap items-center gap-3">
        <span className="font-semibold">
          {context && <span className="text-ink-soft">{context} </span>}
          {entry.name}
        </span>
        <span className="text-caption text-ink-faint">proposed by {entry.proposedBy ?? 'deleted rider'}</span>
        <span className="ml-auto flex flex-wrap gap-2">
          <button
            type="button"
            disabled={busy}
            className="rounded-full bg-moss-700 px-3.5 py-1 text-caption font-semibold text-white"
            onClick={() => onAction({ kind: 'curate', type, id: entry.id, input: { action: 'approve' } })}
          >
            Approve
          </button>
          {(['rename', 'merge', 'reject'] as const).map((m) => (
            <button
              key={m}
              type="button"
              aria-pressed={mode === m}
              className="rounded-full border border-paper-line px-3.5 py-1 text-caption font-semibold capitalize"
              onClick={() => setMode(mode === m ? null : m)}
            >
              {m}
            </button>
          ))}
        </span>
      </div>
      {mode && (
        <form onSubmit={submit} className="mt-3 flex flex-wrap items-end gap-3">
          {mode === 'merge' && (
            <label className="flex flex-col gap-1 text-caption font-medium">
              Number of the entry to keep
              <input
                required
                inputMode="numeric"
                pattern="[0-9]+"
                value={intoId}
                onChange={(e) => setIntoId(e.target.value)}
                className="w-40 rounded-lg border border-paper-line px-3 py-1.5"
              />
            </label>
          )}
          <label className="flex flex-1 flex-col gap-1 text-caption font-medium">
            {mode === 'rename' ? 'New name' : mode === 'reject' ? 'Why it is rejected' : 'Why they are the same'}
            <input
              required
              maxLength={mode === 'rename' ? 80 : 1000}
              value={text}
              onChange={(e) => setText(e.target.value)}
              className="rounded-lg border border-paper-line px-3 py-1.5"
            />
          </label>
          <button type="submit" disabled={busy} className="rounded-full bg-fjord-700 px-4 py-1.5 text-caption font-semibold text-paper">
            Save
          </button>
        </form>
      )}
    </li>
  );
}
