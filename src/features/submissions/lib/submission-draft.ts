import type { MeasurementPosition, Side } from '@shared/analysis/types';
import { AFTER_DRIVETRAIN_KINDS, type Catalogue } from '@shared/schemas/catalogue';
import {
  createSubmissionInput,
  type CreateSubmissionInput,
  type RECORDING_MODES,
  type Surface,
  type ZERO_OFFSET_ANSWERS,
} from '@shared/schemas/submission';
import { MAX_FIT_FILE_BYTES } from '@shared/limits';

/** What the form holds for one recording: strings as the controls give them, '' for "not chosen yet". */
export interface RecordingDraft {
  makerId: string;
  modelId: string;
  firmwareId: string;
  position: MeasurementPosition | '';
  recordingDeviceId: string;
  recordingDeviceFirmware: string;
  recordingMode: (typeof RECORDING_MODES)[number] | '';
  zeroOffset: (typeof ZERO_OFFSET_ANSWERS)[number] | '';
  otherMetersOn: 'yes' | 'no' | '';
}

export interface SubmissionDraft {
  a: RecordingDraft;
  b: RecordingDraft;
  indoor: 'indoor' | 'outdoor' | '';
  surface: Surface | '';
  notes: string;
}

export const emptyRecordingDraft: RecordingDraft = {
  makerId: '',
  modelId: '',
  firmwareId: '',
  position: '',
  recordingDeviceId: '',
  recordingDeviceFirmware: '',
  recordingMode: '',
  zeroOffset: '',
  otherMetersOn: '',
};

export const emptySubmissionDraft: SubmissionDraft = { a: emptyRecordingDraft, b: emptyRecordingDraft, indoor: '', surface: '', notes: '' };

/** Field errors keyed like the server's `details.fields`: 'a.modelId', 'surface', 'fileA'. */
export type FieldErrors = Record<string, string>;

function toTags(draft: RecordingDraft) {
  return {
    modelId: draft.modelId,
    firmwareId: draft.firmwareId,
    position: draft.position || undefined,
    recordingDeviceId: draft.recordingDeviceId,
    recordingDeviceFirmware: draft.recordingDeviceFirmware,
    recordingMode: draft.recordingMode || undefined,
    zeroOffset: draft.zeroOffset || undefined,
    otherMetersOn: draft.otherMetersOn === '' ? undefined : draft.otherMetersOn === 'yes',
  };
}

/** Runs the shared schema (the one the server uses) over the form. */
export function parseDraft(draft: SubmissionDraft): { input: CreateSubmissionInput; errors: null } | { input: null; errors: FieldErrors } {
  const parsed = createSubmissionInput.safeParse({
    a: toTags(draft.a),
    b: toTags(draft.b),
    indoor: draft.indoor === '' ? undefined : draft.indoor === 'indoor',
    surface: draft.surface || undefined,
    notes: draft.notes,
  });
  if (parsed.success) return { input: parsed.data, errors: null };
  const errors: FieldErrors = {};
  for (const issue of parsed.error.issues) {
    const key = issue.path.join('.');
    errors[key] ??= issue.message;
  }
  // A rider who has not picked a maker yet is told so on the maker, not the model.
  for (const side of ['a', 'b'] as const) {
    if (!draft[side].makerId && errors[`${side}.modelId`]) errors[`${side}.makerId`] = 'choose a maker';
  }
  return { input: null, errors };
}

export const FILE_FIELD: Record<Side, 'fileA' | 'fileB'> = { a: 'fileA', b: 'fileB' };

export function checkFile(side: Side, file: File | null): string | undefined {
  if (!file) return side === 'a' ? 'choose the first FIT file (A)' : 'choose the second FIT file (B)';
  if (file.size > MAX_FIT_FILE_BYTES)
    return `this file is larger than ${MAX_FIT_FILE_BYTES / (1024 * 1024)} MB, which no ride recording should be`;
  if (file.size === 0) return 'this file is empty';
  return undefined;
}

export function isAfterDrivetrain(catalogue: Catalogue | undefined, modelId: string): boolean {
  const model = catalogue?.models.find((m) => String(m.id) === modelId);
  return model ? AFTER_DRIVETRAIN_KINDS.includes(model.kind) : false;
}
