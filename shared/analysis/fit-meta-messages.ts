import { AnalysisError } from './errors';
import { readFieldValue, type FitDefinition } from './fit-reader';

// The few non-record messages the decoder keeps, as raw numbers (NaN = absent or
// invalid). Message and field numbers from the FIT SDK profile (21.217).

export const MESG_FILE_ID = 0;
export const MESG_SESSION = 18;
export const MESG_RECORD = 20;
export const MESG_DEVICE_INFO = 23;
export const MESG_ACTIVITY = 34;
export const META_MESSAGES = new Set([MESG_FILE_ID, MESG_SESSION, MESG_DEVICE_INFO, MESG_ACTIVITY]);

export const FIT_FILE_ACTIVITY = 4;

/** FIT SDK profile, type `file`, in the words a rider would use. */
const FILE_TYPE_NAMES: Record<number, string> = {
  1: 'device description',
  2: 'settings',
  3: 'sport settings',
  4: 'activity',
  5: 'workout',
  6: 'course',
  7: 'schedule',
  9: 'weight',
  10: 'totals',
  11: 'goals',
  14: 'blood pressure',
  15: 'monitoring',
  20: 'activity summary',
  28: 'daily monitoring',
  32: 'monitoring',
  34: 'segment',
  35: 'segment list',
  40: 'data-screen configuration',
};

export function fitFileTypeName(type: number): string {
  return FILE_TYPE_NAMES[type] ?? `type ${type}`;
}

/** One device_info message. */
export interface FitDeviceMessage {
  fitTime: number;
  deviceIndex: number;
  deviceType: number;
  manufacturer: number;
  serialNumber: number;
  product: number;
  /** Raw: hundredths (scale 100). */
  softwareVersion: number;
  /** Raw: 1/256 V (scale 256). */
  batteryVoltage: number;
  batteryStatus: number;
  /** Seconds. */
  cumOperatingTime: number;
  antDeviceNumber: number;
  sourceType: number;
}

export interface FitMetaMessages {
  /** file_id.type of every chained part. */
  fileTypes: number[];
  /** The first file_id's maker, product and serial number. */
  creator: { manufacturer: number; product: number; serialNumber: number } | null;
  devices: FitDeviceMessage[];
  /** FIT seconds. */
  sessions: Array<{ start: number; end: number }>;
  activityEnd: number;
}

/** More device or session messages than this is no recording (one every 10 s for two days is 17,280). */
const MAX_META_MESSAGES = 50_000;

const DEVICE_FIELDS = {
  deviceIndex: 0,
  deviceType: 1,
  manufacturer: 2,
  serialNumber: 3,
  product: 4,
  softwareVersion: 5,
  cumOperatingTime: 7,
  batteryVoltage: 10,
  batteryStatus: 11,
  antDeviceNumber: 21,
  sourceType: 25,
} as const;

export function collectMetaMessage(
  meta: FitMetaMessages,
  bytes: Uint8Array,
  definition: FitDefinition,
  offset: number,
  fitTime: number,
): void {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const field = (num: number): number => {
    let value = NaN;
    // The last field of a number wins when a definition repeats one, as in the FIT SDK.
    for (const layout of definition.fields) {
      if (layout.num === num)
        value = readFieldValue(bytes, view, offset + layout.offset, layout.size, layout.baseType, definition.littleEndian);
    }
    return value;
  };
  if (meta.devices.length + meta.sessions.length > MAX_META_MESSAGES) {
    throw new AnalysisError(
      'too_many_records',
      `This file holds more than ${MAX_META_MESSAGES.toLocaleString('en-GB')} device or session messages; no ride recording has that many.`,
    );
  }
  switch (definition.globalNumber) {
    case MESG_FILE_ID:
      meta.fileTypes.push(field(0));
      meta.creator ??= { manufacturer: field(1), product: field(2), serialNumber: field(3) };
      break;
    case MESG_DEVICE_INFO: {
      const message = { fitTime } as FitDeviceMessage;
      for (const [name, num] of Object.entries(DEVICE_FIELDS)) message[name as keyof typeof DEVICE_FIELDS] = field(num);
      meta.devices.push(message);
      break;
    }
    case MESG_SESSION:
      meta.sessions.push({ start: field(2), end: fitTime });
      break;
    case MESG_ACTIVITY:
      if (!Number.isNaN(fitTime)) meta.activityEnd = Number.isNaN(meta.activityEnd) ? fitTime : Math.max(meta.activityEnd, fitTime);
      break;
  }
}
