import { z } from 'zod';
import { MEASUREMENT_POSITIONS } from '../analysis/types';
import { MODEL_KINDS } from './catalogue';
import { day } from './day';
import { RECORDING_MODES, SUBMISSION_STATUSES, SURFACES, ZERO_OFFSET_ANSWERS } from './submission';

// What the API shows of a submission, field by field. Nothing here carries a
// device's serial number, a file hash or a time finer than a day: the presenter
// builds these from stored rows, and these schemas are the allow-list.

const num = z.number();
const maybe = num.nullable();
const side = z.enum(['a', 'b']);

const flag = z.object({ code: z.string(), severity: z.enum(['info', 'warning', 'severe']), message: z.string() });
const dropoutSummary = z.object({
  count: num,
  seconds: num,
  ratePerHour: maybe,
  events: z.array(z.object({ startSeconds: num, endSeconds: num, durationSeconds: num })),
});
const bandBias = z.object({ label: z.string(), from: num, to: maybe, matchedSeconds: num, percent: maybe, meanDifferenceWatts: maybe });
const pair = z.object({ a: maybe, b: maybe });
/** Seconds from the alignment start, never a clock time. */
const batteryReading = z.object({ atSeconds: num, status: maybe, volts: maybe });

/** The per-ride comparison as the public sees it: relative seconds only, no devices, no clock times. */
export const rideComparisonView = z.object({
  methodVersion: num,
  positions: z.object({ a: z.enum(MEASUREMENT_POSITIONS), b: z.enum(MEASUREMENT_POSITIONS) }),
  alignment: z.object({ clockOffsetSeconds: num, overlapSeconds: num, correlation: num }),
  bias: z.object({ percent: maybe, meanDifferenceWatts: maybe, matchedSeconds: num }),
  pedallingSeconds: num,
  agreement: z.object({
    blockSeconds: num,
    blockCount: num,
    meanDifferenceWatts: maybe,
    sdWatts: maybe,
    lowerLimitWatts: maybe,
    upperLimitWatts: maybe,
    meanDifferencePercent: maybe,
    sdPercent: maybe,
    lowerLimitPercent: maybe,
    upperLimitPercent: maybe,
    pearsonR: maybe,
    concordance: maybe,
    deming: z.object({ slope: num, intercept: num }).nullable(),
    blocks: z.array(z.object({ startSeconds: num, aWatts: num, bWatts: num })),
  }),
  dropouts: z.object({
    a: z.object({ power: dropoutSummary, cadence: dropoutSummary }),
    b: z.object({ power: dropoutSummary, cadence: dropoutSummary }),
    pedallingSeconds: num,
  }),
  cadenceLagSeconds: maybe,
  cadenceLagCorrelation: maybe,
  peaks: z.object({
    best: z.array(z.object({ durationSeconds: num, aWatts: maybe, bWatts: maybe, percent: maybe })),
    averageWatts: pair,
    normalisedWatts: pair,
    sprints: z.array(
      z.object({
        startSeconds: num,
        durationSeconds: num,
        aPeakWatts: num,
        bPeakWatts: num,
        percent: maybe,
        aSecondsTo80Percent: maybe,
        bSecondsTo80Percent: maybe,
      }),
    ),
  }),
  powerBands: z.array(bandBias),
  cadenceBands: z.array(bandBias),
  steadySegments: z.array(z.object({ startSeconds: num, durationSeconds: num, aWatts: num, bWatts: num, percent: num })),
  likeForLike: z.object({
    mode: z.enum(['direct', 'via_balance', 'mixed']),
    percent: maybe,
    naivePercent: maybe,
    leg: z.enum(['left', 'right']).nullable(),
    expectedDrivetrainPercent: maybe,
  }),
  smoothing: z.object({ aVariation: maybe, bVariation: maybe, ratio: maybe }),
  flags: z.array(flag),
  series: z.object({
    intervalSeconds: num,
    aWatts: z.array(maybe),
    bWatts: z.array(maybe),
    differenceWatts: z.array(maybe),
  }),
  // Absent on rides analysed before they were computed.
  drift: z.object({ percentPerHour: num, lower: num, upper: num, wattsPerHour: num, blocks: num, spanHours: num }).nullable().optional(),
  temperature: z
    .object({
      minCelsius: num,
      maxCelsius: num,
      meanCelsius: num,
      bands: z.array(z.object({ band: z.string(), seconds: num, percent: maybe })),
    })
    .nullable()
    .optional(),
  battery: z.object({ a: z.array(batteryReading), b: z.array(batteryReading) }).optional(),
});
export type RideComparisonView = z.infer<typeof rideComparisonView>;

const deviceIdentityView = z.object({ manufacturerId: maybe, productId: maybe, softwareVersion: maybe });
/** What the files say about the devices, for the rider and moderators: makes and software, never a serial number. */
export const deviceInfoView = z.object({ creator: deviceIdentityView, powerMeter: deviceIdentityView.nullable() });
export type DeviceInfoView = z.infer<typeof deviceInfoView>;

export const submissionRecordingView = z.object({
  side,
  position: z.enum(MEASUREMENT_POSITIONS),
  makerName: z.string(),
  makerSlug: z.string(),
  modelId: num,
  modelName: z.string(),
  modelSlug: z.string(),
  modelKind: z.enum(MODEL_KINDS),
  firmwareId: num,
  firmwareVersion: z.string(),
  recordingDeviceId: num,
  recordingDeviceName: z.string(),
  recordingDeviceFirmware: z.string(),
  recordingMode: z.enum(RECORDING_MODES),
  zeroOffset: z.enum(ZERO_OFFSET_ANSWERS),
  otherMetersOn: z.boolean(),
  /** Only for the rider, moderators and admins. */
  deviceInfo: deviceInfoView.optional(),
});
export type SubmissionRecordingView = z.infer<typeof submissionRecordingView>;

export const submissionView = z.object({
  id: num,
  status: z.enum(SUBMISSION_STATUSES),
  indoor: z.boolean(),
  surface: z.enum(SURFACES),
  notes: z.string(),
  /** Days only: next to a handle, the exact start of a ride says where someone was when. */
  rideDate: day.nullable(),
  submittedOn: day,
  analysedOn: day.nullable(),
  version: num,
  result: rideComparisonView.nullable(),
  flags: z.array(flag),
  errorCode: z.string().nullable(),
  errorMessage: z.string().nullable(),
  rider: z.object({ handle: z.string().nullable(), name: z.string() }),
  isOwn: z.boolean(),
  recordings: z.array(submissionRecordingView),
});
export type SubmissionView = z.infer<typeof submissionView>;

export const mySubmissionView = z.object({
  id: num,
  status: z.enum(SUBMISSION_STATUSES),
  submittedOn: day,
  biasPercent: maybe,
  flags: z.array(flag),
  recordings: z.array(z.object({ side, model: z.string(), firmware: z.string() })),
});
export type MySubmissionView = z.infer<typeof mySubmissionView>;
export const mySubmissionsResponse = z.object({ submissions: z.array(mySubmissionView) });
export type MySubmissionsResponse = z.infer<typeof mySubmissionsResponse>;
