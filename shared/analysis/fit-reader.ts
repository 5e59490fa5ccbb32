import { AnalysisError } from './errors';
import { crc16Arc } from './fit-crc';

// The FIT protocol's framing (FIT SDK, "Flexible and Interoperable Data Transfer
// Protocol", sections 3.3–4.1): file header, definition and data messages, normal and
// compressed-timestamp record headers, developer fields, the CRCs, and files chained
// back to back. It reads no profile: callers pick the fields they need by number.
// It never allocates per data message, so its cost is linear in the file's bytes.

/** One field of a definition: where it sits in the data message and how to read it. */
export interface FitFieldLayout {
  num: number;
  offset: number;
  size: number;
  /** Base type number (low five bits of the definition's byte). */
  baseType: number;
}

export interface FitDefinition {
  globalNumber: number;
  littleEndian: boolean;
  /** Bytes of one data message after its header, developer fields included. */
  size: number;
  fields: FitFieldLayout[];
  /** The timestamp field (253), when the definition has one. */
  timestamp: FitFieldLayout | null;
}

/**
 * Called for every data message. `offset` is where its fields start in `bytes`;
 * `fitTime` is its timestamp in FIT seconds (field 253 or the compressed header's),
 * NaN when it has none.
 */
export type FitMessageVisitor = (definition: FitDefinition, offset: number, fitTime: number) => void;

/** Called for every definition message; `at` is its record header's offset in `bytes`. */
export type FitDefinitionVisitor = (definition: FitDefinition, at: number, localType: number) => void;

/** Unix seconds at the FIT epoch, 1989-12-31T00:00:00Z (FIT SDK profile, date_time). */
export const FIT_EPOCH_UNIX_SECONDS = 631065600;

/** Field number of every message's timestamp (FIT SDK profile). */
export const TIMESTAMP_FIELD = 253;

/** Byte width of each base type, by number; undefined = not a FIT base type (FIT SDK, fit.js). */
const BASE_TYPE_WIDTH: readonly (number | undefined)[] = [1, 1, 1, 2, 2, 4, 4, 1, 4, 8, 1, 2, 4, 1, 8, 8, 8];

const COMPRESSED_HEADER = 0x80;
const DEFINITION_HEADER = 0x40;
const DEVELOPER_DATA = 0x20;

export interface FitWalkSummary {
  /** Files chained back to back in the bytes (usually 1). */
  parts: number;
}

/**
 * Walks every chained file in the bytes, checking sizes and CRCs first, and calls
 * `visit` for every data message. Throws AnalysisError (not_fit, ended_early,
 * damaged_file) with a message that says which part is wrong.
 */
export function walkFit(bytes: Uint8Array, visit: FitMessageVisitor, visitDefinition?: FitDefinitionVisitor): FitWalkSummary {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  // Local definitions carry over between chained parts, as in the FIT SDK's Decoder.
  const definitions: (FitDefinition | undefined)[] = new Array(16);
  const state = { lastFitTime: NaN };
  let start = 0;
  let parts = 0;
  while (start < bytes.length) {
    if (parts > 0 && !looksLikeHeader(bytes, start)) {
      if (isZeroPadding(bytes, start)) break;
      throw damaged(`it has ${bytes.length - start} bytes of something else after its end`);
    }
    const dataEnd = checkPart(bytes, view, start, parts);
    readMessages(bytes, view, start + bytes[start], dataEnd, definitions, state, visit, visitDefinition);
    start = dataEnd + 2;
    parts++;
  }
  return { parts };
}

function looksLikeHeader(bytes: Uint8Array, at: number): boolean {
  const size = bytes[at];
  return (
    (size === 12 || size === 14) &&
    at + 12 <= bytes.length &&
    bytes[at + 8] === 0x2e &&
    bytes[at + 9] === 0x46 &&
    bytes[at + 10] === 0x49 &&
    bytes[at + 11] === 0x54
  );
}

function isZeroPadding(bytes: Uint8Array, from: number): boolean {
  for (let i = from; i < bytes.length; i++) if (bytes[i] !== 0) return false;
  return true;
}

/** Checks one part's header and CRCs; returns where its data ends (its CRC follows). */
function checkPart(bytes: Uint8Array, view: DataView, start: number, index: number): number {
  if (!looksLikeHeader(bytes, start)) {
    throw new AnalysisError(
      'not_fit',
      'This file is not a FIT file. Export the original .fit file of the ride from your head unit or app.',
    );
  }
  const headerSize = bytes[start];
  const dataSize = view.getUint32(start + 4, true);
  const dataEnd = start + headerSize + dataSize;
  const where = index === 0 ? '' : ` (in its part ${index + 1}: the file holds several FIT files back to back)`;
  if (dataSize === 0 && bytes.length > start + headerSize + 2) throw endedEarly(`its header still says it holds no data${where}`);
  if (dataEnd + 2 > bytes.length)
    throw endedEarly(
      `its header promises ${dataSize} bytes of data but only ${Math.max(0, bytes.length - start - headerSize)} follow, and the final checksum is missing${where}`,
    );
  if (headerSize === 14) {
    const headerCrc = view.getUint16(start + 12, true);
    if (headerCrc !== 0 && headerCrc !== crc16Arc(bytes, start, start + 12))
      throw damaged(`its header checksum does not match its header${where}`);
  }
  if (view.getUint16(dataEnd, true) !== crc16Arc(bytes, start, dataEnd)) throw damaged(`its checksum does not match its contents${where}`);
  return dataEnd;
}

function readMessages(
  bytes: Uint8Array,
  view: DataView,
  from: number,
  dataEnd: number,
  definitions: (FitDefinition | undefined)[],
  state: { lastFitTime: number },
  visit: FitMessageVisitor,
  visitDefinition: FitDefinitionVisitor | undefined,
): void {
  let pos = from;
  while (pos < dataEnd) {
    const header = bytes[pos++];
    if ((header & COMPRESSED_HEADER) !== 0) {
      // Compressed timestamp header (protocol 4.1.2): local type in bits 5–6, the low
      // five bits of the time in bits 0–4, relative to the last timestamp seen.
      const definition = definitions[(header >> 5) & 0x03];
      if (definition === undefined) throw damaged(`a record at byte ${pos - 1} uses a message type the file never defined`);
      if (pos + definition.size > dataEnd) throw damaged(`its last message (at byte ${pos - 1}) runs past the end of its data`);
      const last = state.lastFitTime;
      let fitTime = NaN;
      if (!Number.isNaN(last)) {
        const offset = header & 0x1f;
        const low = last & 0x1f;
        fitTime = last - low + offset + (offset < low ? 32 : 0);
        state.lastFitTime = fitTime;
      }
      visit(definition, pos, fitTime);
      pos += definition.size;
    } else if ((header & DEFINITION_HEADER) !== 0) {
      const at = pos - 1;
      pos = readDefinition(bytes, view, pos, header, dataEnd, definitions);
      visitDefinition?.(definitions[header & 0x0f]!, at, header & 0x0f);
    } else {
      const definition = definitions[header & 0x0f];
      if (definition === undefined) throw damaged(`a record at byte ${pos - 1} uses a message type the file never defined`);
      if (pos + definition.size > dataEnd) throw damaged(`its last message (at byte ${pos - 1}) runs past the end of its data`);
      let fitTime = NaN;
      const field = definition.timestamp;
      if (field !== null) {
        fitTime = readFieldValue(bytes, view, pos + field.offset, field.size, field.baseType, definition.littleEndian);
        if (!Number.isNaN(fitTime)) state.lastFitTime = fitTime;
      }
      visit(definition, pos, fitTime);
      pos += definition.size;
    }
  }
}

function readDefinition(
  bytes: Uint8Array,
  view: DataView,
  at: number,
  header: number,
  dataEnd: number,
  definitions: (FitDefinition | undefined)[],
): number {
  let pos = at;
  if (pos + 5 > dataEnd) throw damaged(`a message definition at byte ${at - 1} is cut off`);
  // Byte 0 is reserved; any architecture byte but 0 means big-endian, as the FIT SDK reads it.
  const littleEndian = bytes[pos + 1] === 0;
  const globalNumber = view.getUint16(pos + 2, littleEndian);
  const fieldCount = bytes[pos + 4];
  pos += 5;
  if (pos + fieldCount * 3 > dataEnd) throw damaged(`a message definition at byte ${at - 1} is cut off`);
  const fields: FitFieldLayout[] = [];
  let timestamp: FitFieldLayout | null = null;
  let size = 0;
  for (let i = 0; i < fieldCount; i++, pos += 3) {
    const baseType = bytes[pos + 2] & 0x1f;
    if (BASE_TYPE_WIDTH[baseType] === undefined) throw damaged(`a message definition at byte ${at - 1} names an unknown kind of value`);
    const field: FitFieldLayout = { num: bytes[pos], offset: size, size: bytes[pos + 1], baseType };
    fields.push(field);
    if (field.num === TIMESTAMP_FIELD) timestamp = field;
    size += field.size;
  }
  if ((header & DEVELOPER_DATA) !== 0) {
    if (pos + 1 > dataEnd) throw damaged(`a message definition at byte ${at - 1} is cut off`);
    const developerCount = bytes[pos++];
    if (pos + developerCount * 3 > dataEnd) throw damaged(`a message definition at byte ${at - 1} is cut off`);
    // Developer fields are skipped: nothing the comparison needs lives in them.
    for (let i = 0; i < developerCount; i++, pos += 3) size += bytes[pos + 1];
  }
  definitions[header & 0x0f] = { globalNumber, littleEndian, size, fields, timestamp };
  return pos;
}

/**
 * The field's first value as a number; NaN when the bytes do not fit the base
 * type, the value is the type's invalid value, or it is not numeric (string).
 * Arrays give their first element, as the FIT SDK's first array entry.
 */
export function readFieldValue(
  bytes: Uint8Array,
  view: DataView,
  at: number,
  size: number,
  baseType: number,
  littleEndian: boolean,
): number {
  const width = BASE_TYPE_WIDTH[baseType];
  if (width === undefined || size === 0 || size % width !== 0) return NaN;
  let value: number;
  switch (baseType) {
    case 0x00: // enum
    case 0x02: // uint8
    case 0x0d: // byte
      value = bytes[at];
      return value === 0xff ? NaN : value;
    case 0x0a: // uint8z
      value = bytes[at];
      return value === 0 ? NaN : value;
    case 0x01:
      value = view.getInt8(at);
      return value === 0x7f ? NaN : value;
    case 0x03:
      value = view.getInt16(at, littleEndian);
      return value === 0x7fff ? NaN : value;
    case 0x04:
      value = view.getUint16(at, littleEndian);
      return value === 0xffff ? NaN : value;
    case 0x0b:
      value = view.getUint16(at, littleEndian);
      return value === 0 ? NaN : value;
    case 0x05:
      value = view.getInt32(at, littleEndian);
      return value === 0x7fffffff ? NaN : value;
    case 0x06:
      value = view.getUint32(at, littleEndian);
      return value === 0xffffffff ? NaN : value;
    case 0x0c:
      value = view.getUint32(at, littleEndian);
      return value === 0 ? NaN : value;
    case 0x08:
      return view.getFloat32(at, littleEndian);
    case 0x09:
      return view.getFloat64(at, littleEndian);
    case 0x0e:
      return Number(view.getBigInt64(at, littleEndian));
    case 0x0f:
    case 0x10:
      // The FIT SDK never treats 64-bit values as invalid; neither do we.
      return Number(view.getBigUint64(at, littleEndian));
    default:
      return NaN; // string
  }
}

function damaged(reason: string): AnalysisError {
  return new AnalysisError(
    'damaged_file',
    `This file is damaged: ${reason}. Try exporting it again from the device or app that recorded it.`,
  );
}

function endedEarly(reason: string): AnalysisError {
  return new AnalysisError(
    'ended_early',
    `This file ended early: ${reason}. That happens when a head unit switches off (a flat battery) before the ride is saved, or when a download is cut short. Crosswatt does not repair cut-off files: save or export the ride again, and if the device's copy is cut off too, this ride cannot be used.`,
  );
}
