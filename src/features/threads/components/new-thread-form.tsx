import { useId, useState } from 'react';
import { createThreadInput, POST_BODY_MAX, THREAD_TITLE_MAX, type FirmwareRef } from '@shared/schemas/threads';
import { useCreateThread } from '../api/create-thread';
import { fieldErrors } from '../lib/field-errors';
import { FormError, FormField, inputClass, primaryButtonClass } from './form-field';
import { SubmissionPicker } from './submission-picker';

export function NewThreadForm({
  modelSlug,
  firmware,
  onCreated,
}: {
  modelSlug: string;
  firmware: FirmwareRef[];
  onCreated: (id: number) => void;
}) {
  const id = useId();
  const [title, setTitle] = useState('');
  const [body, setBody] = useState('');
  const [firmwareId, setFirmwareId] = useState<number | ''>('');
  const [submissionIds, setSubmissionIds] = useState<number[]>([]);
  const [checkErrors, setCheckErrors] = useState<Record<string, string>>({});
  const create = useCreateThread(modelSlug, { onSuccess: (created) => onCreated(created.id) });
  const errors = { ...fieldErrors(create.error), ...checkErrors };

  return (
    <form
      aria-label="Start a thread"
      noValidate
      className="space-y-4 rounded-card border border-paper-line bg-white p-5"
      onSubmit={(e) => {
        e.preventDefault();
        const input = { title, body, firmwareId: firmwareId === '' ? null : firmwareId, submissionIds };
        const parsed = createThreadInput.safeParse(input);
        setCheckErrors(parsed.success ? {} : fieldErrors(parsed.error));
        if (parsed.success) create.mutate(input);
      }}
    >
      <FormField
        id={`${id}-title`}
        label="What do you see?"
        error={errors.title}
        hint="One line, e.g. “Cadence drops out on gravel since 3.2”."
      >
        <input
          id={`${id}-title`}
          value={title}
          maxLength={THREAD_TITLE_MAX}
          onChange={(e) => setTitle(e.target.value)}
          aria-invalid={!!errors.title}
          className={inputClass}
        />
      </FormField>
      <FormField id={`${id}-firmware`} label="Firmware (optional)" error={errors.firmwareId}>
        <select
          id={`${id}-firmware`}
          value={firmwareId}
          onChange={(e) => setFirmwareId(e.target.value ? Number(e.target.value) : '')}
          className={inputClass}
        >
          <option value="">Any or unknown</option>
          {firmware.map((f) => (
            <option key={f.id} value={f.id}>
              {f.version}
            </option>
          ))}
        </select>
      </FormField>
      <FormField
        id={`${id}-body`}
        label="Details"
        error={errors.body}
        hint="When it happens, how often, what you ride it with. Markdown works."
      >
        <textarea
          id={`${id}-body`}
          rows={6}
          maxLength={POST_BODY_MAX}
          value={body}
          onChange={(e) => setBody(e.target.value)}
          aria-invalid={!!errors.body}
          className={inputClass}
        />
      </FormField>
      <SubmissionPicker modelSlug={modelSlug} selected={submissionIds} onChange={setSubmissionIds} />
      <FormError message={create.error && Object.keys(fieldErrors(create.error)).length === 0 ? create.error.message : undefined} />
      <button type="submit" disabled={create.isPending} className={primaryButtonClass}>
        {create.isPending ? 'Starting…' : 'Start the thread'}
      </button>
    </form>
  );
}
