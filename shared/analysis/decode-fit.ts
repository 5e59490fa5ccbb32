import { AnalysisError, formatDuration } from './errors';
import { FIT_EPOCH_UNIX_SECONDS, readFieldValue, walkFit, type FitDefinition } from './fit-reader';
import {
  fitFileTypeName,
  type FitMetaMessages,
  collectMetaMessage,
  FIT_FILE_ACTIVITY,
  MESG_RECORD,
  META_MESSAGES,
} from './fit-meta-messages';
import { deviceInfoFromMessages } from './fit-devices';
import { MAX_CARRY_SECONDS, MIN_OVERLAP_SECONDS } from './method';
import type { RecordingStatistics, RideStream } from './types';

// The only module that turns FIT bytes into a ride: record timestamps, power,
// cadence, balance and temperature, plus device identities and the power meter's
// battery reports; positions and everything else stay inside.

/**
 * Version of this decoder; stored per recording so recordings decoded by an older
 * one can be decoded again. 1: fit-file-parser's raw reader. 2: our own reader (all
 * header variants, chained files, compressed timestamps, bounded cost).
 */
export const DECODER_VERSION = 2;

export { FIT_EPOCH_UNIX_SECONDS };

/**
 * Most records one file may hold. The densest recordings we know of write 16 records a
 * second; a day of that is 1.38 million. The count is taken before any memory is set
 * aside for the records, so a file of millions of tiny records is refused cheaply.
 */
export const MAX_RECORDS_PER_FILE = 1_500_000;

/** No ride lasts this long: a recording whose records span more is refused (its clock jumped). */
export const MAX_RECORDING_SPAN_SECONDS = 48 * 3600;

/** Records may lie this far outside the file's own session start and end (devices round and lag). */
export const SESSION_TOLERANCE_SECONDS = 3600;

const RECORD_CADENCE = 4;
const RECORD_POWER = 7;
const RECORD_TEMPERATURE = 13;
const RECORD_LEFT_RIGHT_BALANCE = 30;

/** Balance byte: bit 0x80 says the low 7 bits are the right leg's share (ANT+ Bicycle Power profile, page 0x10). */
const BALANCE_RIGHT_BIT = 0x80;
const BALANCE_PERCENT_MASK = 0x7f;

export function decodeFit(input: Uint8Array | ArrayBuffer): RideStream {
  const bytes = input instanceof Uint8Array ? input : new Uint8Array(input);
  const stream = readRideStream(bytes);
  assertRecordingUsable(stream);
  return stream;
}

/** Checks signature, sizes and CRCs of every chained part; returns the number of bytes read. */
export function verifyFitFile(bytes: Uint8Array): number {
  walkFit(bytes, () => {});
  return bytes.length;
}

/** Reads the records and devices; refuses what is not an activity or holds too many records. */
export function readRideStream(bytes: Uint8Array): RideStream {
  // First pass: structure, CRCs, the few non-record messages, and the record count,
  // before any memory is set aside for records.
  const meta: FitMetaMessages = { fileTypes: [], devices: [], sessions: [], activityEnd: NaN, creator: null };
  let recordCount = 0;
  let hasTemperature = false;
  let lastDefinition: FitDefinition | null = null;
  walkFit(bytes, (definition, offset, fitTime) => {
    if (definition.globalNumber === MESG_RECORD) {
      if (Number.isNaN(fitTime)) return;
      if (++recordCount > MAX_RECORDS_PER_FILE) throw tooManyRecords();
      if (definition !== lastDefinition) {
        lastDefinition = definition;
        hasTemperature ||= definition.fields.some((field) => field.num === RECORD_TEMPERATURE);
      }
    } else if (META_MESSAGES.has(definition.globalNumber)) {
      collectMetaMessage(meta, bytes, definition, offset, fitTime);
    }
  });
  assertActivity(meta, recordCount);

  const columns = fillRecords(bytes, recordCount, hasTemperature);
  sortByTime(
    columns.timestamps,
    columns.temperatureCelsius
      ? [columns.powerWatts, columns.cadenceRpm, columns.rightBalancePercent, columns.temperatureCelsius]
      : [columns.powerWatts, columns.cadenceRpm, columns.rightBalancePercent],
  );
  assertPlausibleTimes(columns.timestamps, meta);
  const { device, powerMeterReports } = deviceInfoFromMessages(meta);
  return { ...columns, device, powerMeterReports, recording: recordingStatistics(columns.timestamps) };
}

interface RecordLayout {
  definition: FitDefinition;
  power: number;
  cadence: number;
  balance: number;
  temperature: number;
}

function layoutOf(definition: FitDefinition): RecordLayout {
  const layout: RecordLayout = { definition, power: -1, cadence: -1, balance: -1, temperature: -1 };
  // The last field of a number wins when a definition repeats one, as in the FIT SDK.
  definition.fields.forEach((field, index) => {
    if (field.num === RECORD_POWER) layout.power = index;
    else if (field.num === RECORD_CADENCE) layout.cadence = index;
    else if (field.num === RECORD_LEFT_RIGHT_BALANCE) layout.balance = index;
    else if (field.num === RECORD_TEMPERATURE) layout.temperature = index;
  });
  return layout;
}

function fillRecords(bytes: Uint8Array, count: number, hasTemperature: boolean) {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const timestamps = new Float64Array(count);
  // Values in single precision (exact for every value these fields carry): with the
  // smallest records (3 bytes) the columns are what bounds memory per byte of file.
  const powerWatts = new Float32Array(count);
  const cadenceRpm = new Float32Array(count);
  const rightBalancePercent = new Float32Array(count);
  const temperatureCelsius = hasTemperature ? new Float32Array(count) : undefined;
  let layout: RecordLayout | null = null;
  let n = 0;
  const value = (index: number, offset: number, definition: FitDefinition) => {
    if (index < 0) return NaN;
    const field = definition.fields[index];
    return readFieldValue(bytes, view, offset + field.offset, field.size, field.baseType, definition.littleEndian);
  };
  walkFit(bytes, (definition, offset, fitTime) => {
    if (definition.globalNumber !== MESG_RECORD || Number.isNaN(fitTime)) return;
    if (layout === null || layout.definition !== definition) layout = layoutOf(definition);
    timestamps[n] = fitTime + FIT_EPOCH_UNIX_SECONDS;
    powerWatts[n] = value(layout.power, offset, definition);
    cadenceRpm[n] = value(layout.cadence, offset, definition);
    rightBalancePercent[n] = decodeBalance(value(layout.balance, offset, definition));
    if (temperatureCelsius) temperatureCelsius[n] = value(layout.temperature, offset, definition);
    n++;
  });
  return { timestamps, powerWatts, cadenceRpm, rightBalancePercent, ...(temperatureCelsius && { temperatureCelsius }) };
}

function tooManyRecords(): AnalysisError {
  return new AnalysisError(
    'too_many_records',
    `This file holds more than ${MAX_RECORDS_PER_FILE.toLocaleString('en-GB')} records, more than a day of recording at 16 records a second. No ride recording has that many; export the ride itself rather than a merged or generated file.`,
  );
}

function assertActivity(meta: FitMetaMessages, recordCount: number): void {
  const known = meta.fileTypes.filter((type) => !Number.isNaN(type));
  if (known.length > 0 && !known.includes(FIT_FILE_ACTIVITY)) {
    throw new AnalysisError(
      'not_activity',
      `This file is a FIT ${fitFileTypeName(known[0])} file, not a recorded activity. Export the ride itself (the activity file) from your head unit or app.`,
    );
  }
  if (known.length === 0 && recordCount === 0) {
    throw new AnalysisError(
      'not_activity',
      'This file is a FIT file but holds no ride records, so it is not a recorded activity. Export the ride itself (the activity file) from your head unit or app.',
    );
  }
}

function assertPlausibleTimes(timestamps: Float64Array, meta: FitMetaMessages): void {
  const count = timestamps.length;
  if (count < 2) return;
  const span = timestamps[count - 1] - timestamps[0];
  if (span > MAX_RECORDING_SPAN_SECONDS) {
    throw new AnalysisError(
      'implausible_timestamps',
      `This recording spans ${formatSpan(span)}, from ${isoDay(timestamps[0])} to ${isoDay(timestamps[count - 1])}; no ride lasts more than ${MAX_RECORDING_SPAN_SECONDS / 3600} h. Some records carry a wrong time (the device's clock jumped), so the ride cannot be lined up with the other file.`,
    );
  }
  const starts = meta.sessions.map((s) => s.start).filter((t) => !Number.isNaN(t));
  const ends = [...meta.sessions.map((s) => s.end), meta.activityEnd].filter((t) => !Number.isNaN(t));
  if (starts.length === 0 || ends.length === 0) return;
  const from = Math.min(...starts) + FIT_EPOCH_UNIX_SECONDS - SESSION_TOLERANCE_SECONDS;
  const to = Math.max(...ends) + FIT_EPOCH_UNIX_SECONDS + SESSION_TOLERANCE_SECONDS;
  let outside = 0;
  for (let i = 0; i < count; i++) if (timestamps[i] < from || timestamps[i] > to) outside++;
  if (outside > 0) {
    throw new AnalysisError(
      'implausible_timestamps',
      `This recording has ${outside === 1 ? 'a record' : `${outside} records`} dated more than an hour outside the ride's own start and end as the file itself gives them. The device's clock jumped, so the ride cannot be lined up with the other file.`,
    );
  }
}

function formatSpan(seconds: number): string {
  const days = seconds / 86400;
  return days >= 2 ? `${Math.round(days).toLocaleString('en-GB')} days` : `${Math.round(seconds / 3600)} h`;
}

function isoDay(unixSeconds: number): string {
  const date = new Date(unixSeconds * 1000);
  return Number.isNaN(date.getTime()) ? 'an impossible date' : date.toISOString().slice(0, 10);
}

export function assertRecordingUsable(stream: RideStream): void {
  let hasPower = false;
  for (let i = 0; i < stream.powerWatts.length && !hasPower; i++) hasPower = stream.powerWatts[i] >= 0;
  if (!hasPower) {
    throw new AnalysisError(
      'no_power',
      stream.timestamps.length === 0
        ? 'This recording holds no records at all, so it has no power data. Export the full ride from the device that recorded it.'
        : 'This recording has no power data. Was the power meter paired with the head unit on this ride?',
    );
  }
  const duration = stream.recording.endTime - stream.recording.startTime;
  if (duration > MAX_RECORDING_SPAN_SECONDS) {
    throw new AnalysisError(
      'implausible_timestamps',
      `This recording spans ${formatSpan(duration)}; no ride lasts more than ${MAX_RECORDING_SPAN_SECONDS / 3600} h.`,
    );
  }
  if (duration < MIN_OVERLAP_SECONDS) {
    throw new AnalysisError(
      'too_short',
      `This recording is too short: it lasts ${formatDuration(duration)}, and a comparison needs at least ${formatDuration(MIN_OVERLAP_SECONDS)}.`,
    );
  }
}

function decodeBalance(raw: number): number {
  if (Number.isNaN(raw) || (raw & BALANCE_RIGHT_BIT) === 0) return NaN;
  const percent = raw & BALANCE_PERCENT_MASK;
  return percent <= 100 ? percent : NaN;
}

/** Records are normally in time order; an out-of-order file is sorted (stably) rather than rejected. */
function sortByTime(timestamps: Float64Array, columns: Float32Array[]): void {
  let sorted = true;
  for (let i = 1; i < timestamps.length && sorted; i++) sorted = timestamps[i] >= timestamps[i - 1];
  if (sorted) return;
  const order = Uint32Array.from(timestamps.keys()).sort((x, y) => timestamps[x] - timestamps[y] || x - y);
  const permute = (column: Float32Array | Float64Array) => {
    const copy = column.slice();
    for (let i = 0; i < order.length; i++) column[i] = copy[order[i]];
  };
  permute(timestamps);
  for (const column of columns) permute(column);
}

export function recordingStatistics(timestamps: Float64Array): RecordingStatistics {
  const count = timestamps.length;
  // Whole seconds within the span the decoder allows: exact in single precision.
  const intervals = new Float32Array(Math.max(count - 1, 0));
  let longGapCount = 0;
  let longGapSeconds = 0;
  for (let i = 1; i < count; i++) {
    const interval = timestamps[i] - timestamps[i - 1];
    intervals[i - 1] = interval;
    if (interval > MAX_CARRY_SECONDS) {
      longGapCount++;
      longGapSeconds += interval;
    }
  }
  intervals.sort();
  const median = intervals.length === 0 ? 0 : intervals[Math.floor(intervals.length / 2)];
  return {
    recordCount: count,
    startTime: count > 0 ? timestamps[0] : 0,
    endTime: count > 0 ? timestamps[count - 1] : 0,
    medianIntervalSeconds: median,
    longGapCount,
    longGapSeconds,
  };
}
