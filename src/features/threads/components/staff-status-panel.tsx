import { useId, useState } from 'react';
import { THREAD_STATUS_LABELS, THREAD_STATUSES, type ThreadDetail, type ThreadStatus } from '@shared/schemas/threads';
import { useSetThreadStatus } from '../api/set-thread-status';
import { fieldErrors } from '../lib/field-errors';
import { FormError, inputClass, primaryButtonClass } from './form-field';

/** For the maker's verified staff: say where the maker stands on this report. */
export function StaffStatusPanel({ thread }: { thread: ThreadDetail }) {
  const id = useId();
  const [status, setStatus] = useState<ThreadStatus>(thread.status);
  const [fixedIn, setFixedIn] = useState<number | ''>(thread.fixedIn?.id ?? '');
  const save = useSetThreadStatus(thread.id, thread.model.slug);
  const errors = fieldErrors(save.error);

  return (
    <form
      aria-label="Maker status"
      className="space-y-3 rounded-card border border-fjord-300 bg-fjord-50 p-4"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate({ status, fixedInFirmwareId: status === 'fixed' && fixedIn !== '' ? fixedIn : null });
      }}
    >
      <p className="text-caption font-semibold uppercase tracking-widest text-fjord-700">For {thread.model.maker.name} staff</p>
      <div className="flex flex-wrap items-end gap-3">
        <div className="space-y-1">
          <label htmlFor={`${id}-status`} className="block text-caption font-semibold">
            Thread status
          </label>
          <select id={`${id}-status`} value={status} onChange={(e) => setStatus(e.target.value as ThreadStatus)} className={inputClass}>
            {THREAD_STATUSES.map((s) => (
              <option key={s} value={s}>
                {THREAD_STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        {status === 'fixed' && (
          <div className="space-y-1">
            <label htmlFor={`${id}-fixed`} className="block text-caption font-semibold">
              Fixed in firmware
            </label>
            <select
              id={`${id}-fixed`}
              value={fixedIn}
              onChange={(e) => setFixedIn(e.target.value ? Number(e.target.value) : '')}
              aria-invalid={!!errors.fixedInFirmwareId}
              className={inputClass}
            >
              <option value="">Choose a version</option>
              {thread.model.firmware.map((f) => (
                <option key={f.id} value={f.id}>
                  {f.version}
                </option>
              ))}
            </select>
          </div>
        )}
        <button type="submit" disabled={save.isPending} className={primaryButtonClass}>
          Set status
        </button>
      </div>
      <FormError message={save.error?.message} />
    </form>
  );
}
