// FIT files built message by message, byte by byte, for the decoder tests and the ingest benchmark:
// writes on request: big-endian definitions, compressed timestamp headers, developer
// fields, odd header sizes and CRCs, chained files, cut-off files. Layout from the
// FIT protocol (FIT SDK, "Flexible and Interoperable Data Transfer Protocol", 3.3–4.1).
import { crc16Arc } from '@shared/analysis/fit-crc';

/** Base type bytes as written in definitions (FIT SDK, fit.js: number | endian flag). */
export const BASE = {
  enum: 0x00,
  sint8: 0x01,
  uint8: 0x02,
  sint16: 0x83,
  uint16: 0x84,
  sint32: 0x85,
  uint32: 0x86,
  string: 0x07,
  uint8z: 0x0a,
  uint16z: 0x8b,
  uint32z: 0x8c,
} as const;
const WIDTH: Record<number, number> = { 0x00: 1, 0x01: 1, 0x02: 1, 0x83: 2, 0x84: 2, 0x85: 4, 0x86: 4, 0x07: 1, 0x0a: 1, 0x8b: 2, 0x8c: 4 };

export type FieldSpec = [num: number, baseType: number, size?: number];

interface LocalDefinition {
  fields: FieldSpec[];
  bigEndian: boolean;
  developerBytes: number;
}

export interface HeaderOptions {
  headerSize?: 12 | 14;
  /** 'set' (default) writes the header CRC; 'zero' leaves it 0, as the protocol allows. */
  headerCrc?: 'set' | 'zero';
  protocolVersion?: number;
  profileVersion?: number;
}

export class FitBytes {
  private readonly bytes: number[] = [];
  private readonly locals = new Map<number, LocalDefinition>();

  define(
    local: number,
    globalNumber: number,
    fields: FieldSpec[],
    options: { bigEndian?: boolean; developer?: Array<[num: number, size: number, index: number]> } = {},
  ): this {
    const bigEndian = options.bigEndian ?? false;
    this.bytes.push(0x40 | (options.developer ? 0x20 : 0) | local, 0, bigEndian ? 1 : 0);
    this.bytes.push(...u16(globalNumber, bigEndian), fields.length);
    for (const [num, baseType, size] of fields) this.bytes.push(num, size ?? WIDTH[baseType], baseType);
    let developerBytes = 0;
    if (options.developer) {
      this.bytes.push(options.developer.length);
      for (const [num, size, index] of options.developer) {
        this.bytes.push(num, size, index);
        developerBytes += size;
      }
    }
    this.locals.set(local, { fields, bigEndian, developerBytes });
    return this;
  }

  /** A data message; `values` per field (null = the type's invalid value), `developer` = raw developer bytes. */
  data(local: number, values: Array<number | null>, options: { compressedTime?: number; developer?: number[] } = {}): this {
    const definition = this.locals.get(local);
    if (!definition) throw new Error(`local ${local} not defined`);
    if (options.compressedTime !== undefined) this.bytes.push(0x80 | (local << 5) | (options.compressedTime & 0x1f));
    else this.bytes.push(local);
    for (const [i, [, baseType, size]] of definition.fields.entries()) {
      this.bytes.push(...encodeValue(values[i] ?? null, baseType, size ?? WIDTH[baseType], definition.bigEndian));
    }
    const developer = options.developer ?? new Array(definition.developerBytes).fill(0xff);
    this.bytes.push(...developer);
    return this;
  }

  /** The messages as a whole FIT file. */
  toFile(options: HeaderOptions = {}): Uint8Array {
    return fitFile(Uint8Array.from(this.bytes), options);
  }
}

export function fitFile(data: Uint8Array, options: HeaderOptions = {}): Uint8Array {
  const headerSize = options.headerSize ?? 14;
  const file = new Uint8Array(headerSize + data.length + 2);
  const view = new DataView(file.buffer);
  file[0] = headerSize;
  file[1] = options.protocolVersion ?? 0x20;
  view.setUint16(2, options.profileVersion ?? 21217, true);
  view.setUint32(4, data.length, true);
  file.set([0x2e, 0x46, 0x49, 0x54], 8);
  if (headerSize === 14 && options.headerCrc !== 'zero') view.setUint16(12, crc16Arc(file, 0, 12), true);
  file.set(data, headerSize);
  view.setUint16(headerSize + data.length, crc16Arc(file, 0, headerSize + data.length), true);
  return file;
}

/** Files back to back, as some devices write them. */
export function chain(...files: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(files.reduce((n, f) => n + f.length, 0));
  let at = 0;
  for (const file of files) {
    out.set(file, at);
    at += file.length;
  }
  return out;
}

function u16(value: number, bigEndian: boolean): number[] {
  return bigEndian ? [(value >> 8) & 0xff, value & 0xff] : [value & 0xff, (value >> 8) & 0xff];
}

const INVALID: Record<number, number> = {
  0x00: 0xff,
  0x01: 0x7f,
  0x02: 0xff,
  0x83: 0x7fff,
  0x84: 0xffff,
  0x85: 0x7fffffff,
  0x86: 0xffffffff,
  0x07: 0,
  0x0a: 0,
  0x8b: 0,
  0x8c: 0,
};

function encodeValue(value: number | null, baseType: number, size: number, bigEndian: boolean): number[] {
  const width = WIDTH[baseType];
  const out = new Uint8Array(size);
  const view = new DataView(out.buffer);
  for (let at = 0; at + width <= size; at += width) {
    const v = at === 0 && value !== null ? value : INVALID[baseType];
    if (width === 1) view.setUint8(at, v & 0xff);
    else if (width === 2) view.setUint16(at, v & 0xffff, !bigEndian);
    else view.setUint32(at, v >>> 0, !bigEndian);
  }
  return Array.from(out);
}

/** FIT SDK profile numbers used by the fixtures. */
export const MESG = { fileId: 0, session: 18, record: 20, deviceInfo: 23, activity: 34 } as const;
export const FILE_TYPE = { settings: 2, activity: 4, workout: 5, monitoringB: 32 } as const;
export const FIT_EPOCH = 631065600;

/** A plain activity: file_id, then one record a second (timestamp, power, cadence). */
export function simpleActivity(
  options: { seconds: number; start?: number; fileType?: number; power?: (i: number) => number | null; time?: (i: number) => number } = {
    seconds: 900,
  },
): Uint8Array {
  const start = (options.start ?? 1_717_225_200) - FIT_EPOCH;
  const fit = new FitBytes()
    .define(0, MESG.fileId, [
      [0, BASE.enum],
      [1, BASE.uint16],
      [2, BASE.uint16],
      [3, BASE.uint32z],
      [4, BASE.uint32],
    ])
    .data(0, [options.fileType ?? FILE_TYPE.activity, 255, 1, 4242, start])
    .define(1, MESG.record, [
      [253, BASE.uint32],
      [7, BASE.uint16],
      [4, BASE.uint8],
    ]);
  for (let i = 0; i < options.seconds; i++)
    fit.data(1, [options.time ? options.time(i) - FIT_EPOCH : start + i, options.power ? options.power(i) : 200 + (i % 40), 90]);
  return fit.toFile();
}

/**
 * A valid activity of `count` power-only records, 3 bytes each after the first
 * (compressed timestamp headers): the smallest file that holds that many records.
 */
export function tinyRecordFile(count: number, start = 1_717_225_200, perSecond = 4): Uint8Array {
  const head = new FitBytes()
    .define(0, MESG.fileId, [[0, BASE.enum]])
    .data(0, [FILE_TYPE.activity])
    .define(1, MESG.record, [
      [253, BASE.uint32],
      [7, BASE.uint16],
    ])
    .data(1, [start - FIT_EPOCH, 200])
    .define(2, MESG.record, [[7, BASE.uint16]]);
  const headBytes = head.toFile().subarray(14, -2);
  const data = new Uint8Array(headBytes.length + (count - 1) * 3);
  data.set(headBytes);
  for (let i = 1, at = headBytes.length; i < count; i++, at += 3) {
    data[at] = 0x80 | (2 << 5) | ((start - FIT_EPOCH + Math.floor(i / perSecond)) & 0x1f);
    data[at + 1] = 200;
    data[at + 2] = 0;
  }
  return fitFile(data);
}
