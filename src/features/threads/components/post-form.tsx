import { useId, useState } from 'react';
import { createPostInput, POST_BODY_MAX } from '@shared/schemas/threads';
import { fieldErrors } from '../lib/field-errors';
import { FormError, FormField, inputClass, primaryButtonClass, quietButtonClass } from './form-field';
import { SubmissionPicker } from './submission-picker';

interface PostFormProps {
  modelSlug: string;
  label: string;
  submitLabel: string;
  initialBody?: string;
  linkSubmissions?: boolean;
  pending: boolean;
  error: unknown;
  onSubmit: (input: { body: string; submissionIds: number[] }) => Promise<unknown>;
  onCancel?: () => void;
}

/** Writing a reply or editing a post; checked with the same schema as the server. */
export function PostForm({
  modelSlug,
  label,
  submitLabel,
  initialBody = '',
  linkSubmissions = true,
  pending,
  error,
  onSubmit,
  onCancel,
}: PostFormProps) {
  const id = useId();
  const [body, setBody] = useState(initialBody);
  const [submissionIds, setSubmissionIds] = useState<number[]>([]);
  const [checkErrors, setCheckErrors] = useState<Record<string, string>>({});
  const errors = { ...fieldErrors(error), ...checkErrors };

  async function submit(event: React.FormEvent) {
    event.preventDefault();
    const parsed = createPostInput.safeParse({ body, submissionIds });
    setCheckErrors(parsed.success ? {} : fieldErrors(parsed.error));
    if (!parsed.success) return;
    await onSubmit({ body, submissionIds });
    setBody('');
    setSubmissionIds([]);
  }

  return (
    <form onSubmit={submit} className="space-y-3" noValidate>
      <FormField
        id={`${id}-body`}
        label={label}
        error={errors.body}
        hint="Markdown: *emphasis*, **bold**, `code`, lists, quotes and links."
      >
        <textarea
          id={`${id}-body`}
          value={body}
          onChange={(e) => setBody(e.target.value)}
          rows={5}
          maxLength={POST_BODY_MAX}
          aria-invalid={!!errors.body}
          className={inputClass}
        />
      </FormField>
      {linkSubmissions && <SubmissionPicker modelSlug={modelSlug} selected={submissionIds} onChange={setSubmissionIds} />}
      {errors.submissionIds && <p className="text-caption font-medium text-alert-600">{errors.submissionIds}</p>}
      <FormError message={error instanceof Error && !errors.body && !errors.submissionIds ? error.message : undefined} />
      <div className="flex gap-2">
        <button type="submit" disabled={pending} className={primaryButtonClass}>
          {pending ? 'Sending…' : submitLabel}
        </button>
        {onCancel && (
          <button type="button" onClick={onCancel} className={quietButtonClass}>
            Cancel
          </button>
        )}
      </div>
    </form>
  );
}
