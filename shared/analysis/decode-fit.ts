import { FitMessageReaderError, readFitMessages } from 'fit-file-parser/raw';
import type { FitRawField, FitRawMessage } from 'fit-file-parser/raw';
import { AnalysisError, formatDuration } from './errors';
import { crc16Arc } from './fit-crc';
import { MAX_CARRY_SECONDS, MIN_OVERLAP_SECONDS } from './method';
import type { DeviceIdentity, DeviceInfo, RecordingStatistics, RideStream } from './types';

// The only module that reads FIT. It keeps record timestamps, power, cadence and
// balance, plus device identities; positions and everything else stay inside.

/** Unix seconds at the FIT epoch, 1989-12-31T00:00:00Z (FIT SDK profile, date_time). */
export const FIT_EPOCH_UNIX_SECONDS = 631065600;

const MESG_FILE_ID = 0;
const MESG_RECORD = 20;
const MESG_DEVICE_INFO = 23;

const RECORD_CADENCE = 4;
const RECORD_POWER = 7;
const RECORD_LEFT_RIGHT_BALANCE = 30;

const SOURCE_ANTPLUS = 1;
const SOURCE_BLE = 3;
const ANTPLUS_BIKE_POWER = 11;
const BLE_BIKE_POWER = 2;

/** Balance byte: bit 0x80 says the low 7 bits are the right leg's share (ANT+ Bicycle Power profile, page 0x10). */
const BALANCE_RIGHT_BIT = 0x80;
const BALANCE_PERCENT_MASK = 0x7f;

export function decodeFit(input: Uint8Array | ArrayBuffer): RideStream {
  const bytes = input instanceof Uint8Array ? input : new Uint8Array(input);
  const fileEnd = verifyFitFile(bytes);
  const messages = readMessages(bytes.subarray(0, fileEnd));
  const stream = buildStream(messages);
  assertRecordingUsable(stream);
  return stream;
}

/** Checks signature, sizes and CRCs; returns the end of the first FIT file in the bytes. */
export function verifyFitFile(bytes: Uint8Array): number {
  const headerSize = bytes[0];
  const hasSignature =
    bytes.length >= 12 && bytes[8] === 0x2e && bytes[9] === 0x46 && bytes[10] === 0x49 && bytes[11] === 0x54;
  if (!hasSignature || (headerSize !== 12 && headerSize !== 14)) {
    throw new AnalysisError('not_fit', 'This file is not a FIT activity file. Export the original .fit file from your head unit or app.');
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const dataEnd = headerSize + view.getUint32(4, true);
  if (bytes.length < dataEnd + 2) {
    throw damaged('it ends before its data does, as if the upload or export was cut short');
  }
  if (headerSize === 14) {
    const headerCrc = view.getUint16(12, true);
    if (headerCrc !== 0 && headerCrc !== crc16Arc(bytes, 0, 12)) throw damaged('its header checksum does not match');
  }
  if (view.getUint16(dataEnd, true) !== crc16Arc(bytes, 0, dataEnd)) {
    throw damaged('its checksum does not match its contents');
  }
  return dataEnd + 2;
}

function damaged(reason: string): AnalysisError {
  return new AnalysisError('damaged_file', `This file is damaged or incomplete: ${reason}. Try exporting it again.`);
}

function readMessages(bytes: Uint8Array): FitRawMessage[] {
  try {
    return readFitMessages(bytes, { messageNumbers: [MESG_FILE_ID, MESG_RECORD, MESG_DEVICE_INFO] }).messages;
  } catch (error) {
    if (error instanceof FitMessageReaderError) throw damaged('its structure cannot be read');
    throw error;
  }
}

export function assertRecordingUsable(stream: RideStream): void {
  let hasPower = false;
  for (let i = 0; i < stream.powerWatts.length && !hasPower; i++) hasPower = stream.powerWatts[i] >= 0;
  if (!hasPower) {
    throw new AnalysisError('no_power', 'This recording has no power data. Was the power meter paired with the head unit on this ride?');
  }
  const duration = stream.recording.endTime - stream.recording.startTime;
  if (duration < MIN_OVERLAP_SECONDS) {
    throw new AnalysisError(
      'too_short',
      `This recording is too short: it lasts ${formatDuration(duration)}, and a comparison needs at least ${formatDuration(MIN_OVERLAP_SECONDS)}.`,
    );
  }
}

function buildStream(messages: FitRawMessage[]): RideStream {
  let recordCount = 0;
  for (const message of messages) if (message.globalMessageNumber === MESG_RECORD && message.timestamp !== undefined) recordCount++;

  const timestamps = new Float64Array(recordCount);
  const powerWatts = new Float64Array(recordCount);
  const cadenceRpm = new Float64Array(recordCount);
  const rightBalancePercent = new Float64Array(recordCount);
  let creator: DeviceIdentity = emptyIdentity();
  let creatorSoftware: number | null = null;
  let powerMeter: DeviceIdentity | null = null;
  let n = 0;

  for (const message of messages) {
    if (message.globalMessageNumber === MESG_RECORD) {
      if (message.timestamp === undefined) continue;
      timestamps[n] = message.timestamp + FIT_EPOCH_UNIX_SECONDS;
      powerWatts[n] = NaN;
      cadenceRpm[n] = NaN;
      rightBalancePercent[n] = NaN;
      for (const field of message.fields) {
        if (field.fieldNumber === RECORD_POWER) powerWatts[n] = readUnsigned(field, message.littleEndian);
        else if (field.fieldNumber === RECORD_CADENCE) cadenceRpm[n] = readUnsigned(field, message.littleEndian);
        else if (field.fieldNumber === RECORD_LEFT_RIGHT_BALANCE) rightBalancePercent[n] = decodeBalance(readUnsigned(field, message.littleEndian));
      }
      n++;
    } else if (message.globalMessageNumber === MESG_FILE_ID) {
      const fields = byNumber(message);
      creator = {
        manufacturerId: optional(readUnsigned(fields.get(1), message.littleEndian)),
        productId: optional(readUnsigned(fields.get(2), message.littleEndian)),
        serialNumber: optional(readUnsigned(fields.get(3), message.littleEndian)),
        softwareVersion: null,
      };
    } else if (message.globalMessageNumber === MESG_DEVICE_INFO) {
      const fields = byNumber(message);
      const identity = deviceIdentity(fields, message.littleEndian);
      const deviceIndex = readUnsigned(fields.get(0), message.littleEndian);
      if (deviceIndex === 0) creatorSoftware ??= identity.softwareVersion;
      if (powerMeter === null && isPowerMeter(fields, message.littleEndian)) powerMeter = identity;
    }
  }
  sortByTime(timestamps, [powerWatts, cadenceRpm, rightBalancePercent]);
  const device: DeviceInfo = { creator: { ...creator, softwareVersion: creatorSoftware }, powerMeter };
  return { timestamps, powerWatts, cadenceRpm, rightBalancePercent, device, recording: recordingStatistics(timestamps) };
}

function emptyIdentity(): DeviceIdentity {
  return { manufacturerId: null, productId: null, serialNumber: null, softwareVersion: null };
}

function byNumber(message: FitRawMessage): Map<number, FitRawField> {
  return new Map(message.fields.map((field) => [field.fieldNumber, field]));
}

function deviceIdentity(fields: Map<number, FitRawField>, littleEndian: boolean): DeviceIdentity {
  const software = readUnsigned(fields.get(5), littleEndian);
  return {
    manufacturerId: optional(readUnsigned(fields.get(2), littleEndian)),
    productId: optional(readUnsigned(fields.get(4), littleEndian)),
    serialNumber: optional(readUnsigned(fields.get(3), littleEndian)),
    // software_version has scale 100 in the FIT profile.
    softwareVersion: Number.isNaN(software) ? null : software / 100,
  };
}

function isPowerMeter(fields: Map<number, FitRawField>, littleEndian: boolean): boolean {
  const deviceType = readUnsigned(fields.get(1), littleEndian);
  const sourceType = readUnsigned(fields.get(25), littleEndian);
  if (sourceType === SOURCE_BLE) return deviceType === BLE_BIKE_POWER;
  return (Number.isNaN(sourceType) || sourceType <= SOURCE_ANTPLUS) && deviceType === ANTPLUS_BIKE_POWER;
}

/** Unsigned FIT base types by id: byte width and whether zero is the invalid value (the "z" types). */
const UNSIGNED_BASE_TYPES: Record<number, { width: 1 | 2 | 4; zeroInvalid: boolean }> = {
  0x00: { width: 1, zeroInvalid: false },
  0x02: { width: 1, zeroInvalid: false },
  0x04: { width: 2, zeroInvalid: false },
  0x06: { width: 4, zeroInvalid: false },
  0x0a: { width: 1, zeroInvalid: true },
  0x0b: { width: 2, zeroInvalid: true },
  0x0c: { width: 4, zeroInvalid: true },
  0x0d: { width: 1, zeroInvalid: false },
};

/** First element of an unsigned field; NaN when absent, of another type, or the type's invalid value. */
function readUnsigned(field: FitRawField | undefined, littleEndian: boolean): number {
  const type = field === undefined ? undefined : UNSIGNED_BASE_TYPES[field.baseType & 0x1f];
  if (field === undefined || type === undefined || field.bytes.length < type.width) return NaN;
  const b = field.bytes;
  let value: number;
  if (type.width === 1) value = b[0];
  else if (type.width === 2) value = littleEndian ? b[0] | (b[1] << 8) : (b[0] << 8) | b[1];
  else value = (littleEndian ? b[0] | (b[1] << 8) | (b[2] << 16) | (b[3] << 24) : (b[0] << 24) | (b[1] << 16) | (b[2] << 8) | b[3]) >>> 0;
  const invalid = type.zeroInvalid ? 0 : 2 ** (8 * type.width) - 1;
  return value === invalid ? NaN : value;
}

function optional(value: number): number | null {
  return Number.isNaN(value) ? null : value;
}

function decodeBalance(raw: number): number {
  if (Number.isNaN(raw) || (raw & BALANCE_RIGHT_BIT) === 0) return NaN;
  const percent = raw & BALANCE_PERCENT_MASK;
  return percent <= 100 ? percent : NaN;
}

/** Records are normally in time order; a rare out-of-order file is sorted rather than rejected. */
function sortByTime(timestamps: Float64Array, columns: Float64Array[]): void {
  let sorted = true;
  for (let i = 1; i < timestamps.length && sorted; i++) sorted = timestamps[i] >= timestamps[i - 1];
  if (sorted) return;
  const order = Array.from(timestamps.keys()).sort((x, y) => timestamps[x] - timestamps[y]);
  for (const column of [timestamps, ...columns]) {
    const copy = column.slice();
    for (let i = 0; i < order.length; i++) column[i] = copy[order[i]];
  }
}

export function recordingStatistics(timestamps: Float64Array): RecordingStatistics {
  const count = timestamps.length;
  const intervals = new Float64Array(Math.max(count - 1, 0));
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
