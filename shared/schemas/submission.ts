import { z } from 'zod';
import { idNumber, multiLineText, singleLineText } from './fields';
import { MEASUREMENT_POSITIONS } from '../analysis/types';
import { MAX_NOTES_LENGTH } from '../limits';

export const SURFACES = ['smooth_road', 'rough_road', 'gravel', 'trainer'] as const;
export const RECORDING_MODES = ['every_second', 'change_only'] as const;
export const ZERO_OFFSET_ANSWERS = ['yes', 'no', 'unsure'] as const;
export const SUBMISSION_STATUSES = [
  'received',
  'analysing',
  'awaiting_review',
  'sent_back',
  'accepted',
  'rejected',
  'withdrawn',
  'failed',
] as const;
export type SubmissionStatus = (typeof SUBMISSION_STATUSES)[number];
export type Surface = (typeof SURFACES)[number];
export type RecordingMode = (typeof RECORDING_MODES)[number];
export type ZeroOffsetAnswer = (typeof ZERO_OFFSET_ANSWERS)[number];

export const SURFACE_LABELS: Record<Surface, string> = {
  smooth_road: 'Smooth road',
  rough_road: 'Rough road',
  gravel: 'Gravel',
  trainer: 'Trainer',
};

const id = (what: string) => idNumber(`choose a ${what}`);

/** What the rider says about one of the two recordings. */
export const recordingTagsInput = z.object({
  modelId: id('model'),
  firmwareId: id('firmware version'),
  position: z.enum(MEASUREMENT_POSITIONS, { message: 'choose left, right, dual or total' }),
  recordingDeviceId: id('recording device'),
  recordingDeviceFirmware: singleLineText().trim().max(40, 'at most 40 characters').default(''),
  recordingMode: z.enum(RECORDING_MODES, { message: 'choose every second or change-only' }),
  zeroOffset: z.enum(ZERO_OFFSET_ANSWERS, { message: 'say whether you did a zero offset' }),
  otherMetersOn: z.boolean({ message: 'say whether other meters were switched on' }),
});
export type RecordingTagsInput = z.infer<typeof recordingTagsInput>;

/** The form and the server validate with this one schema. */
export const createSubmissionInput = z.object({
  a: recordingTagsInput,
  b: recordingTagsInput,
  indoor: z.boolean({ message: 'say whether the ride was indoors' }),
  surface: z.enum(SURFACES, { message: 'choose a surface' }),
  notes: multiLineText().trim().max(MAX_NOTES_LENGTH, `at most ${MAX_NOTES_LENGTH} characters`).default(''),
});
export type CreateSubmissionInput = z.infer<typeof createSubmissionInput>;

/** What an accepted upload answers: the new submission, waiting for its analysis. */
export interface CreatedSubmission {
  id: number;
  status: 'received';
  url: string;
}
