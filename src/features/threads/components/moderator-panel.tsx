import { useId, useState } from 'react';
import type { ThreadDetail } from '@shared/schemas/threads';
import { useSetThreadLocked } from '../api/lock-thread';
import { useMoveThread } from '../api/move-thread';
import { FormError, inputClass, quietButtonClass } from './form-field';

/** For moderators who are independent of this maker: lock, or move to the right model. */
export function ModeratorPanel({ thread }: { thread: ThreadDetail }) {
  const id = useId();
  const lock = useSetThreadLocked(thread.id, thread.model.slug);
  const move = useMoveThread(thread.id, thread.model.slug);
  const [target, setTarget] = useState('');
  const [reason, setReason] = useState('');

  return (
    <section aria-label="Moderation" className="space-y-3 rounded-card border border-paper-line bg-paper-deep p-4">
      <p className="text-caption font-semibold uppercase tracking-widest text-ink-soft">Moderation</p>
      <button type="button" className={quietButtonClass} disabled={lock.isPending} onClick={() => lock.mutate(!thread.locked)}>
        {thread.locked ? 'Unlock thread' : 'Lock thread'}
      </button>
      <form
        className="flex flex-wrap items-end gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          move.mutate({ modelSlug: target.trim(), reason: reason.trim() });
        }}
      >
        <div className="space-y-1">
          <label htmlFor={`${id}-target`} className="block text-caption font-semibold">
            Move to model (its address name)
          </label>
          <input id={`${id}-target`} value={target} onChange={(e) => setTarget(e.target.value)} className={inputClass} />
        </div>
        <div className="space-y-1">
          <label htmlFor={`${id}-reason`} className="block text-caption font-semibold">
            Reason
          </label>
          <input id={`${id}-reason`} value={reason} onChange={(e) => setReason(e.target.value)} className={inputClass} />
        </div>
        <button type="submit" className={quietButtonClass} disabled={move.isPending}>
          Move
        </button>
      </form>
      <FormError message={(lock.error ?? move.error)?.message} />
    </section>
  );
}
