import { crc16Arc } from '../analysis/fit-crc';
import { isPositionDeveloperField, isPositionField } from './position-fields';

// Removes every coordinate from a FIT file in place: each position field (native,
// or a developer field that is one) is overwritten with its base type's invalid
// value and the file's CRC is recomputed, so the result is still a valid FIT file
// in which every other byte is the original's. It walks the file's own definition
// messages, so it needs no decoder: 12- and 14-byte headers, compressed-timestamp
// records, developer data and chained files (several FIT files one after another)
// all go through the same loop. Structure from the FIT protocol description
// (FIT SDK, "Flexible and Interoperable Data Transfer Protocol", sections 3.2–3.4).

export interface StrippedFit {
  bytes: Uint8Array;
  /** Values overwritten (one per field occurrence, not per element). */
  clearedFields: number;
  /** FIT files found one after another in the bytes. */
  fileCount: number;
  /** Bytes after the last FIT file that are not one: left out of the copy, as nothing can read them. */
  droppedTrailingBytes: number;
}

export class FitStructureError extends Error {
  readonly code = 'damaged_file';
}

const HEADER_SIGNATURE = [0x2e, 0x46, 0x49, 0x54]; // ".FIT"
const COMPRESSED_TIMESTAMP_HEADER = 0x80;
const DEFINITION_HEADER = 0x40;
const DEVELOPER_DATA_FLAG = 0x20;
const LOCAL_TYPE_MASK = 0x0f;

const MESG_FIELD_DESCRIPTION = 206;
const FIELD_DESCRIPTION = {
  developerDataIndex: 0,
  fieldDefinitionNumber: 1,
  fitBaseTypeId: 2,
  fieldName: 3,
  units: 8,
  nativeMesgNum: 14,
  nativeFieldNum: 15,
} as const;

interface FieldDefinition {
  number: number;
  size: number;
  baseType: number;
}

interface DeveloperFieldDefinition {
  number: number;
  size: number;
  developerDataIndex: number;
}

interface MessageDefinition {
  globalMessageNumber: number;
  littleEndian: boolean;
  fields: FieldDefinition[];
  developerFields: DeveloperFieldDefinition[];
}

interface DeveloperFieldDescription {
  baseType: number;
  isPosition: boolean;
}

/** Copies the file with every coordinate replaced by the FIT invalid value. */
export function stripFitLocation(input: Uint8Array): StrippedFit {
  const bytes = input.slice();
  let offset = 0;
  let fileCount = 0;
  let clearedFields = 0;
  while (offset < bytes.length && isFitHeader(bytes, offset)) {
    const file = stripOneFile(bytes, offset);
    clearedFields += file.clearedFields;
    fileCount++;
    offset = file.end;
  }
  if (fileCount === 0) throw new FitStructureError('This file is not a FIT file.');
  return { bytes: bytes.subarray(0, offset), clearedFields, fileCount, droppedTrailingBytes: bytes.length - offset };
}

function isFitHeader(bytes: Uint8Array, offset: number): boolean {
  const headerSize = bytes[offset];
  if ((headerSize !== 12 && headerSize !== 14) || offset + headerSize > bytes.length) return false;
  return HEADER_SIGNATURE.every((b, i) => bytes[offset + 8 + i] === b);
}

/**
 * One FIT file from `start`. A file whose header announces more data than there
 * is (a recording cut short, or a data size of 0 written while recording) is
 * walked to the end of the bytes; it has no CRC to update.
 */
function stripOneFile(bytes: Uint8Array, start: number): { end: number; clearedFields: number } {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const headerSize = bytes[start];
  const dataSize = view.getUint32(start + 4, true);
  const announcedEnd = start + headerSize + dataSize;
  const terminated = dataSize > 0 && announcedEnd + 2 <= bytes.length;
  const dataEnd = terminated ? announcedEnd : bytes.length;
  const crcWasValid = terminated && view.getUint16(dataEnd, true) === crc16Arc(bytes, start, dataEnd);

  const definitions = new Map<number, MessageDefinition>();
  const developerFields = new Map<string, DeveloperFieldDescription>();
  let clearedFields = 0;
  let offset = start + headerSize;
  while (offset < dataEnd) {
    const header = bytes[offset++];
    if ((header & COMPRESSED_TIMESTAMP_HEADER) === 0 && (header & DEFINITION_HEADER) !== 0) {
      const parsed = readDefinition(bytes, view, offset, dataEnd, (header & DEVELOPER_DATA_FLAG) !== 0);
      if (parsed === null) {
        if (terminated) throw new FitStructureError('A definition message runs past the end of the file.');
        break;
      }
      definitions.set(header & LOCAL_TYPE_MASK, parsed.definition);
      offset = parsed.end;
      continue;
    }
    const localType = header & COMPRESSED_TIMESTAMP_HEADER ? (header >> 5) & 0x03 : header & LOCAL_TYPE_MASK;
    const definition = definitions.get(localType);
    if (!definition) throw new FitStructureError(`A data message uses local message type ${localType} before its definition.`);
    const messageStart = offset;
    const messageEnd = messageStart + messageSize(definition);
    if (messageEnd > dataEnd && terminated) throw new FitStructureError('A data message runs past the end of the file.');

    let fieldOffset = messageStart;
    for (const field of definition.fields) {
      if (isPositionField(definition.globalMessageNumber, field.number)) {
        if (clearValue(bytes, fieldOffset, field.size, field.baseType, definition.littleEndian, dataEnd)) clearedFields++;
      }
      fieldOffset += field.size;
    }
    for (const field of definition.developerFields) {
      const description = developerFields.get(`${field.developerDataIndex}:${field.number}`);
      if (description?.isPosition) {
        if (clearValue(bytes, fieldOffset, field.size, description.baseType, definition.littleEndian, dataEnd)) clearedFields++;
      }
      fieldOffset += field.size;
    }
    if (definition.globalMessageNumber === MESG_FIELD_DESCRIPTION && messageEnd <= dataEnd) {
      const description = readFieldDescription(bytes, view, messageStart, definition);
      if (description) developerFields.set(description.key, description.value);
    }
    offset = messageEnd;
  }

  if (!terminated) return { end: bytes.length, clearedFields };
  if (crcWasValid) view.setUint16(dataEnd, crc16Arc(bytes, start, dataEnd), true);
  return { end: dataEnd + 2, clearedFields };
}

function readDefinition(
  bytes: Uint8Array,
  view: DataView,
  offset: number,
  dataEnd: number,
  hasDeveloperFields: boolean,
): { definition: MessageDefinition; end: number } | null {
  if (offset + 5 > dataEnd) return null;
  const littleEndian = bytes[offset + 1] === 0;
  const globalMessageNumber = view.getUint16(offset + 2, littleEndian);
  const fieldCount = bytes[offset + 4];
  let cursor = offset + 5;
  if (cursor + fieldCount * 3 > dataEnd) return null;
  const fields: FieldDefinition[] = [];
  for (let i = 0; i < fieldCount; i++, cursor += 3) {
    fields.push({ number: bytes[cursor], size: bytes[cursor + 1], baseType: bytes[cursor + 2] });
  }
  const developerFields: DeveloperFieldDefinition[] = [];
  if (hasDeveloperFields) {
    if (cursor + 1 > dataEnd) return null;
    const developerFieldCount = bytes[cursor++];
    if (cursor + developerFieldCount * 3 > dataEnd) return null;
    for (let i = 0; i < developerFieldCount; i++, cursor += 3) {
      developerFields.push({ number: bytes[cursor], size: bytes[cursor + 1], developerDataIndex: bytes[cursor + 2] });
    }
  }
  return { definition: { globalMessageNumber, littleEndian, fields, developerFields }, end: cursor };
}

function messageSize(definition: MessageDefinition): number {
  let size = 0;
  for (const field of definition.fields) size += field.size;
  for (const field of definition.developerFields) size += field.size;
  return size;
}

function readFieldDescription(
  bytes: Uint8Array,
  view: DataView,
  messageStart: number,
  definition: MessageDefinition,
): { key: string; value: DeveloperFieldDescription } | null {
  const values = new Map<number, { offset: number; size: number }>();
  let offset = messageStart;
  for (const field of definition.fields) {
    values.set(field.number, { offset, size: field.size });
    offset += field.size;
  }
  const byte = (n: number): number | null => {
    const v = values.get(n);
    return v && v.size >= 1 && bytes[v.offset] !== 0xff ? bytes[v.offset] : null;
  };
  const text = (n: number): string => {
    const v = values.get(n);
    if (!v) return '';
    // String arrays (one name per language) are NUL-separated.
    return new TextDecoder()
      .decode(bytes.subarray(v.offset, v.offset + v.size))
      .split('\0')
      .filter(Boolean)
      .join(' ');
  };
  const developerDataIndex = byte(FIELD_DESCRIPTION.developerDataIndex);
  const fieldNumber = byte(FIELD_DESCRIPTION.fieldDefinitionNumber);
  if (developerDataIndex === null || fieldNumber === null) return null;
  const native = values.get(FIELD_DESCRIPTION.nativeMesgNum);
  const nativeMessage = native && native.size >= 2 ? view.getUint16(native.offset, definition.littleEndian) : 0xffff;
  return {
    key: `${developerDataIndex}:${fieldNumber}`,
    value: {
      baseType: byte(FIELD_DESCRIPTION.fitBaseTypeId) ?? 0x0d,
      isPosition: isPositionDeveloperField({
        name: text(FIELD_DESCRIPTION.fieldName),
        units: text(FIELD_DESCRIPTION.units),
        nativeMessageNumber: nativeMessage === 0xffff ? null : nativeMessage,
        nativeFieldNumber: byte(FIELD_DESCRIPTION.nativeFieldNum),
      }),
    },
  };
}

/** Byte width and invalid value of each FIT base type, by its number (the low 5 bits of the base type byte). */
const INVALID_BY_BASE_TYPE: Record<number, { width: number; invalid: bigint }> = {
  0: { width: 1, invalid: 0xffn }, // enum
  1: { width: 1, invalid: 0x7fn }, // sint8
  2: { width: 1, invalid: 0xffn }, // uint8
  3: { width: 2, invalid: 0x7fffn }, // sint16
  4: { width: 2, invalid: 0xffffn }, // uint16
  5: { width: 4, invalid: 0x7fffffffn }, // sint32
  6: { width: 4, invalid: 0xffffffffn }, // uint32
  7: { width: 1, invalid: 0x00n }, // string
  8: { width: 4, invalid: 0xffffffffn }, // float32
  9: { width: 8, invalid: 0xffffffffffffffffn }, // float64
  10: { width: 1, invalid: 0x00n }, // uint8z
  11: { width: 2, invalid: 0x0000n }, // uint16z
  12: { width: 4, invalid: 0x00000000n }, // uint32z
  13: { width: 1, invalid: 0xffn }, // byte
  14: { width: 8, invalid: 0x7fffffffffffffffn }, // sint64
  15: { width: 8, invalid: 0xffffffffffffffffn }, // uint64
  16: { width: 8, invalid: 0x0000000000000000n }, // uint64z
};

/**
 * Writes the invalid value into every element of a field (bytes past `limit`, in
 * a file cut short, are not there to clear). Leftover bytes of a field whose size
 * is not a whole number of elements become 0xFF, the byte type's invalid value.
 * Returns whether anything was written.
 */
function clearValue(bytes: Uint8Array, offset: number, size: number, baseType: number, littleEndian: boolean, limit: number): boolean {
  const type = INVALID_BY_BASE_TYPE[baseType & 0x1f] ?? INVALID_BY_BASE_TYPE[13];
  const pattern = new Uint8Array(type.width);
  for (let i = 0; i < type.width; i++) {
    const shift = BigInt(8 * (littleEndian ? i : type.width - 1 - i));
    pattern[i] = Number((type.invalid >> shift) & 0xffn);
  }
  const end = Math.min(offset + size, limit);
  const whole = offset + Math.floor(size / type.width) * type.width;
  for (let i = offset; i < end; i++) {
    bytes[i] = i < whole ? pattern[(i - offset) % type.width] : 0xff;
  }
  return end > offset;
}
