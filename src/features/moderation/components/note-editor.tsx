import type { QueryKey } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { type NoteSubject, usePinNote } from '../api/pin-note';
import { ActionDone, ActionError, dangerButton, inputClass, primaryButton } from './curation-parts';

const MAX_NOTE = 280;

/** Pin, edit or take down the short note shown at the top of a model or firmware page. */
export function NoteEditor({
  subject,
  id,
  current,
  affects,
}: {
  subject: NoteSubject;
  id: number;
  current: string | null;
  affects: QueryKey[];
}) {
  const fieldId = useId();
  const [body, setBody] = useState(current ?? '');
  const pin = usePinNote(affects);
  const [done, setDone] = useState<string | null>(null);
  function save(event: React.FormEvent) {
    event.preventDefault();
    setDone(null);
    pin.mutate({ subject, id, body }, { onSuccess: () => setDone('The note is pinned.') });
  }
  function remove() {
    setDone(null);
    pin.mutate(
      { subject, id, body: null },
      {
        onSuccess: () => {
          setBody('');
          setDone('The note is taken down.');
        },
      },
    );
  }
  return (
    <form onSubmit={save} className="space-y-2">
      <label htmlFor={fieldId} className="block text-caption font-medium text-ink">
        Note shown to everyone on this {subject === 'model' ? 'model' : 'firmware'} page
      </label>
      <textarea
        id={fieldId}
        required
        rows={3}
        maxLength={MAX_NOTE}
        value={body}
        onChange={(e) => setBody(e.target.value)}
        aria-describedby={`${fieldId}-count`}
        className={`${inputClass} w-full max-w-2xl`}
        placeholder="For example: this version was withdrawn by the maker after reports of dropouts."
      />
      <p id={`${fieldId}-count`} className="text-caption text-ink-faint">
        {body.length} of {MAX_NOTE} characters
      </p>
      <ActionError error={pin.error} />
      {done && <ActionDone>{done}</ActionDone>}
      <div className="flex flex-wrap gap-2">
        <button type="submit" disabled={pin.isPending} className={primaryButton}>
          {current ? 'Save the note' : 'Pin the note'}
        </button>
        {current && (
          <button type="button" disabled={pin.isPending} onClick={remove} className={dangerButton}>
            Take the note down
          </button>
        )}
      </div>
    </form>
  );
}
