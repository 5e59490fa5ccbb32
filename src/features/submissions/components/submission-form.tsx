import { type FormEvent, useEffect, useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import type { Side } from '@shared/analysis/types';
import { SURFACE_LABELS, SURFACES } from '@shared/schemas/submission';
import { MAX_NOTES_LENGTH } from '@shared/limits';
import { ApiError } from '@/lib/api-client';
import { useCatalogue } from '../api/get-catalogue';
import { useCreateSubmission } from '../api/create-submission';
import { usePairPreview } from '../hooks/use-pair-preview';
import { checkDraftTags, prefillFromFile } from '../lib/file-tags';
import {
  checkFile,
  emptySubmissionDraft,
  FILE_FIELD,
  type FieldErrors,
  isAfterDrivetrain,
  parseDraft,
  type SubmissionDraft,
} from '../lib/submission-draft';
import { FileTagWarnings } from './file-tag-warnings';
import { FitFileDrop } from './fit-file-drop';
import { ChoiceGroup, FieldError, inputBorder, inputClass } from './form-controls';
import { PairPreviewPanel } from './pair-preview-panel';
import { RecordingFieldset } from './recording-fieldset';

const SIDE_TITLES: Record<Side, { file: string; heading: string; text: string; accent: string }> = {
  a: {
    file: 'File A: the meter you want judged',
    heading: 'Meter A, the one being judged',
    text: 'The meter whose accuracy you want to know.',
    accent: 'border-t-ember-500',
  },
  b: {
    file: 'File B: its partner on the same ride',
    heading: 'Meter B, the partner',
    text: 'The other meter on the same bike, recorded at the same time.',
    accent: 'border-t-moss-500',
  },
};

export function SubmissionForm({ signInHref }: { signInHref: string }) {
  const catalogue = useCatalogue();
  const create = useCreateSubmission();
  const navigate = useNavigate();
  const [draft, setDraft] = useState<SubmissionDraft>(emptySubmissionDraft);
  const [files, setFiles] = useState<Record<Side, File | null>>({ a: null, b: null });
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formProblem, setFormProblem] = useState<{ message: string; link?: { to: string; label: string } }>();
  const [tried, setTried] = useState(false);

  const preview = usePairPreview(files.a, files.b, {
    aPosition: draft.a.position || 'total',
    bPosition: draft.b.position || 'total',
    aAfterDrivetrain: isAfterDrivetrain(catalogue.data, draft.a.modelId),
    bAfterDrivetrain: isAfterDrivetrain(catalogue.data, draft.b.modelId),
  });
  const previewError = preview.status === 'done' && !preview.answer.ok ? preview.answer.error : null;
  const fileDevices = preview.status === 'done' && preview.answer.ok ? preview.answer.preview.devices : null;

  // What the files say about their devices fills the blanks when the files are read (and a side's firmware when its model is chosen, in update); the rider's answers stay.
  useEffect(() => {
    if (!fileDevices || !catalogue.data) return;
    const known = catalogue.data;
    setDraft((current) => {
      const next = { ...current, a: prefillFromFile(fileDevices.a, current.a, known), b: prefillFromFile(fileDevices.b, current.b, known) };
      return JSON.stringify(next) === JSON.stringify(current) ? current : next;
    });
  }, [fileDevices, catalogue.data]);

  // Errors the rider sees: the form's own checks, the preview's verdict on a file, and the server's answer.
  const shownErrors: FieldErrors = { ...errors };
  if (previewError?.side) shownErrors[FILE_FIELD[previewError.side]] = previewError.message;

  function collectErrors(next: SubmissionDraft, nextFiles: Record<Side, File | null>): FieldErrors {
    const found: FieldErrors = { ...(parseDraft(next).errors ?? {}) };
    for (const side of ['a', 'b'] as const) {
      const problem = checkFile(side, nextFiles[side]);
      if (problem) found[FILE_FIELD[side]] = problem;
    }
    return found;
  }

  function update(changed: SubmissionDraft) {
    let next = changed;
    if (fileDevices && catalogue.data) {
      for (const side of ['a', 'b'] as const) {
        if (next[side].modelId !== draft[side].modelId)
          next = { ...next, [side]: prefillFromFile(fileDevices[side], next[side], catalogue.data) };
      }
    }
    setDraft(next);
    // Once the rider has tried to send, messages follow their corrections as they type.
    if (tried) setErrors(collectErrors(next, files));
  }

  function chooseFile(side: Side, file: File | null) {
    const nextFiles = { ...files, [side]: file };
    setFiles(nextFiles);
    const fileError = file ? checkFile(side, file) : undefined;
    setErrors((current) => {
      const { [FILE_FIELD[side]]: _dropped, files: _files, ...rest } = current;
      return fileError ? { ...rest, [FILE_FIELD[side]]: fileError } : tried ? collectErrors(draft, nextFiles) : rest;
    });
  }

  function onSubmit(event: FormEvent) {
    event.preventDefault();
    setTried(true);
    setFormProblem(undefined);
    const found = collectErrors(draft, files);
    const parsed = parseDraft(draft);
    if (Object.keys(found).length > 0 || !parsed.input || !files.a || !files.b || previewError?.side) {
      setErrors(found);
      setFormProblem({ message: 'Some answers need another look; each one is marked on its field.' });
      focusFirstError({ ...found, ...(previewError?.side && { [FILE_FIELD[previewError.side]]: previewError.message }) });
      return;
    }
    create.mutate(
      { fileA: files.a, fileB: files.b, meta: parsed.input },
      {
        onSuccess: (created) => navigate(`/submissions/${created.id}`),
        onError: (error) => {
          if (!(error instanceof ApiError)) {
            setFormProblem({ message: 'The upload did not reach Crosswatt. Check your connection and send again.' });
            return;
          }
          const fields = error.details?.fields ?? {};
          setErrors(fields);
          if (error.status === 401)
            setFormProblem({
              message: 'Your session has ended. Sign in again and send the ride; the form keeps your answers only on this page.',
              link: { to: signInHref, label: 'Sign in' },
            });
          else if (error.status === 409 && typeof error.details?.submissionId === 'number')
            setFormProblem({
              message: error.message,
              link: { to: `/submissions/${error.details.submissionId}`, label: 'Open the earlier submission' },
            });
          else setFormProblem({ message: error.message });
          focusFirstError(fields);
        },
      },
    );
  }

  if (catalogue.isPending) return <p className="text-ink-soft">Loading the catalogue of meters…</p>;
  if (catalogue.isError) return <p className="text-alert-800">The catalogue of meters could not be loaded: {catalogue.error.message}</p>;

  const filesError = shownErrors.files;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-10">
      <section aria-labelledby="files-title" className="space-y-4">
        <h2 id="files-title" className="text-title font-semibold">
          1. The two recordings
        </h2>
        <p className="max-w-2xl text-ink-soft">
          Two .fit files of the same ride, each written by the head unit, watch or app paired with one of the meters.
        </p>
        <div className="grid gap-4 md:grid-cols-2">
          {(['a', 'b'] as const).map((side) => (
            <FitFileDrop
              key={side}
              side={side}
              title={SIDE_TITLES[side].file}
              file={files[side]}
              onFile={(file) => chooseFile(side, file)}
              error={shownErrors[FILE_FIELD[side]]}
            />
          ))}
        </div>
        <FieldError id="files-error" message={filesError} />
        <PairPreviewPanel state={preview} />
      </section>

      {(['a', 'b'] as const).map((side) => (
        <section
          key={side}
          aria-labelledby={`meter-${side}-title`}
          className={`space-y-4 rounded-card border border-t-4 border-paper-line bg-white/80 p-5 shadow-card sm:p-7 ${SIDE_TITLES[side].accent}`}
        >
          <div>
            <h2 id={`meter-${side}-title`} className="text-title font-semibold">
              {side === 'a' ? '2.' : '3.'} {SIDE_TITLES[side].heading}
            </h2>
            <p className="text-ink-soft">{SIDE_TITLES[side].text}</p>
          </div>
          <RecordingFieldset
            side={side}
            catalogue={catalogue.data}
            draft={draft[side]}
            onChange={(next) => update({ ...draft, [side]: next })}
            errors={shownErrors}
          />
          {fileDevices && (
            <FileTagWarnings side={side} disagreements={checkDraftTags(fileDevices[side], draft[side], catalogue.data).disagreements} />
          )}
        </section>
      ))}

      <section aria-labelledby="ride-title" className="space-y-5">
        <h2 id="ride-title" className="text-title font-semibold">
          4. The ride
        </h2>
        <ChoiceGroup
          name="indoor"
          legend="Where did you ride?"
          choices={[
            { value: 'outdoor', label: 'Outdoors' },
            { value: 'indoor', label: 'Indoors' },
          ]}
          value={draft.indoor}
          onChange={(indoor) =>
            update({ ...draft, indoor, surface: indoor === 'indoor' ? 'trainer' : draft.surface === 'trainer' ? '' : draft.surface })
          }
          error={shownErrors.indoor}
        />
        <ChoiceGroup
          name="surface"
          legend="Surface"
          choices={SURFACES.map((s) => ({ value: s, label: SURFACE_LABELS[s] }))}
          value={draft.surface}
          onChange={(surface) => update({ ...draft, surface })}
          error={shownErrors.surface}
        />
        <div>
          <label htmlFor="notes" className="mb-1.5 block text-caption font-semibold text-ink">
            Notes <span className="font-normal text-ink-soft">(optional: anything a moderator should know)</span>
          </label>
          <textarea
            id="notes"
            rows={3}
            maxLength={MAX_NOTES_LENGTH + 200}
            value={draft.notes}
            onChange={(e) => update({ ...draft, notes: e.target.value })}
            aria-invalid={shownErrors.notes ? true : undefined}
            aria-describedby={`notes-count${shownErrors.notes ? ' notes-error' : ''}`}
            className={`${inputClass} ${inputBorder(Boolean(shownErrors.notes))}`}
          />
          <p id="notes-count" className="mt-1 text-caption text-ink-soft">
            {draft.notes.length} of {MAX_NOTES_LENGTH} characters
          </p>
          <FieldError id="notes-error" message={shownErrors.notes} />
        </div>
      </section>

      <div className="space-y-3 border-t border-paper-line pt-6">
        {formProblem && (
          <div role="alert" className="rounded-lg border border-alert-600/40 bg-alert-100 p-4 text-alert-800">
            <p className="font-medium">{formProblem.message}</p>
            {formProblem.link && (
              <Link
                to={formProblem.link.to}
                reloadDocument={formProblem.link.to.startsWith('/auth/')}
                className="mt-1 inline-block font-semibold underline"
              >
                {formProblem.link.label}
              </Link>
            )}
          </div>
        )}
        <div className="flex flex-wrap items-center gap-4">
          <button
            type="submit"
            disabled={create.isPending}
            className="rounded-full bg-ember-700 px-7 py-3 font-semibold text-paper shadow-card hover:bg-ember-900 disabled:opacity-60"
          >
            {create.isPending ? 'Uploading…' : 'Send the ride for analysis'}
          </button>
          <p className="text-caption text-ink-soft">Only the power, cadence and timing are kept; location is dropped.</p>
        </div>
      </div>
    </form>
  );
}

// Keyboard and screen-reader users land on the first field that needs attention.
const FIELD_ORDER = ['fileA', 'fileB', 'a.', 'b.', 'indoor', 'surface', 'notes'];
const FIELD_IDS: Record<string, string> = {
  fileA: 'file-a',
  fileB: 'file-b',
  makerId: 'maker',
  modelId: 'model',
  firmwareId: 'firmware',
  position: 'position',
  recordingDeviceId: 'device',
  recordingDeviceFirmware: 'device-firmware',
  notes: 'notes',
};

function focusFirstError(errors: FieldErrors) {
  const keys = Object.keys(errors).sort((x, y) => rank(x) - rank(y));
  const key = keys[0];
  if (!key) return;
  const [scope, field] = key.includes('.') ? key.split('.') : [null, key];
  const id = scope ? `${scope}-${FIELD_IDS[field] ?? field}` : (FIELD_IDS[field] ?? field);
  const element = document.getElementById(id) ?? document.querySelector<HTMLElement>(`[name="${scope ? `${scope}-` : ''}${kebab(field)}"]`);
  element?.focus();
}

function rank(key: string) {
  const index = FIELD_ORDER.findIndex((prefix) => key.startsWith(prefix));
  return index === -1 ? FIELD_ORDER.length : index;
}

function kebab(text: string) {
  return text.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`);
}
