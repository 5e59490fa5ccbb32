// Seeded mutations of valid FIT files for the fuzzer (npm run fuzz:fit): what a
// flaky radio, a dying battery, a buggy exporter or a hostile rider might hand us.
// Each mutant knows what was done to it, so a kept input can be explained. Half
// of the mutants get their checksums recomputed, so they pass the CRC check and
// reach the parser; the rest test the checks themselves. Layout from the FIT
// protocol (FIT SDK, "Flexible and Interoperable Data Transfer Protocol", 3.3–4.1).
import { crc16Arc } from '@shared/analysis/fit-crc';
import { TIMESTAMP_FIELD, walkFit } from '@shared/analysis/fit-reader';
import type { Random } from '@shared/simulator/random';

export const MUTATION_KINDS = [
  'bit_flips',
  'byte_run',
  'truncation',
  'header_field',
  'definition_field',
  'compressed_header',
  'extreme_timestamp',
] as const;
export type MutationKind = (typeof MUTATION_KINDS)[number];

/** Where things sit in a valid seed file: found once per seed, used by every mutant of it. */
export interface FitLayout {
  headerSize: number;
  /** Offset of every message's record header, in file order (definitions and data). */
  messageStarts: number[];
  definitions: Array<{ at: number; fieldCount: number; developer: boolean }>;
  /** Record headers of data messages of local types 0–3 (the ones a compressed header can name). */
  dataHeaders: Array<{ at: number; localType: number }>;
  /** Where a record's uint32 timestamp (field 253) lies, and its byte order. */
  recordTimestamps: Array<{ at: number; littleEndian: boolean }>;
}

export interface Mutant {
  bytes: Uint8Array;
  /** What was done, in order, e.g. "definition_field: field count of the definition at byte 84 set to 0". */
  steps: string[];
  kinds: MutationKind[];
  crcRecomputed: boolean;
}

const MESG_RECORD = 20;
const FIT_SECONDS_PER_DAY = 86_400;

export function fitLayout(bytes: Uint8Array): FitLayout {
  const layout: FitLayout = { headerSize: bytes[0], messageStarts: [], definitions: [], dataHeaders: [], recordTimestamps: [] };
  walkFit(
    bytes,
    (definition, offset) => {
      const at = offset - 1;
      layout.messageStarts.push(at);
      const header = bytes[at];
      const localType = header & 0x80 ? (header >> 5) & 0x03 : header & 0x0f;
      if (localType < 4) layout.dataHeaders.push({ at, localType });
      const field = definition.timestamp;
      if (definition.globalNumber === MESG_RECORD && field !== null && field.size === 4 && !(header & 0x80)) {
        layout.recordTimestamps.push({ at: offset + field.offset, littleEndian: definition.littleEndian });
      }
    },
    (definition, at) => {
      layout.messageStarts.push(at);
      layout.definitions.push({ at, fieldCount: definition.fields.length, developer: (bytes[at] & 0x20) !== 0 });
    },
  );
  layout.messageStarts.sort((x, y) => x - y);
  return layout;
}

/** One to three mutations of `seed`; then, for half the mutants, the checksums recomputed. */
export function mutateFit(seed: Uint8Array, layout: FitLayout, random: Random): Mutant {
  let bytes: Uint8Array = seed.slice();
  const steps: string[] = [];
  const kinds: MutationKind[] = [];
  const count = random.chance(0.7) ? 1 : random.integer(2, 3);
  let truncation = false;
  for (let i = 0; i < count; i++) {
    const kind = pick(random, MUTATION_KINDS);
    // A truncation changes the length and the layout: it is always the last step.
    if (kind === 'truncation') truncation = true;
    else {
      kinds.push(kind);
      steps.push(`${kind}: ${IN_PLACE[kind](bytes, layout, random)}`);
    }
  }
  const crcRecomputed = random.chance(0.5);
  if (truncation) {
    const truncated = truncate(bytes, layout, random, crcRecomputed);
    bytes = truncated.bytes;
    kinds.push('truncation');
    steps.push(`truncation: ${truncated.step}`);
  }
  if (crcRecomputed) recomputeCrcs(bytes);
  return { bytes, steps, kinds, crcRecomputed };
}

type InPlaceMutation = (bytes: Uint8Array, layout: FitLayout, random: Random) => string;

const IN_PLACE: Record<Exclude<MutationKind, 'truncation'>, InPlaceMutation> = {
  bit_flips(bytes, _layout, random) {
    const flips = random.integer(1, 16);
    const where: number[] = [];
    for (let i = 0; i < flips; i++) {
      const at = random.integer(0, bytes.length - 1);
      bytes[at] ^= 1 << random.integer(0, 7);
      where.push(at);
    }
    return `${flips} bit(s) flipped at bytes ${where.join(', ')}`;
  },

  byte_run(bytes, layout, random) {
    const length = random.integer(1, 256);
    const at = random.integer(layout.headerSize, Math.max(layout.headerSize, bytes.length - length));
    const fill = pick(random, ['0x00', '0xff', 'random', 'copy'] as const);
    const from = random.integer(layout.headerSize, Math.max(layout.headerSize, bytes.length - length));
    const source = bytes.slice(from, from + length);
    for (let i = at; i < Math.min(bytes.length, at + length); i++) {
      bytes[i] = fill === '0x00' ? 0 : fill === '0xff' ? 0xff : fill === 'random' ? random.integer(0, 255) : source[i - at];
    }
    return `${length} bytes at byte ${at} overwritten with ${fill === 'copy' ? `the bytes at ${from}` : fill}`;
  },

  header_field(bytes, _layout, random) {
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    const field = pick(random, ['size', 'protocol', 'profile', 'data size', 'signature'] as const);
    if (field === 'size') {
      bytes[0] = pick(random, [0, 1, 11, 12, 13, 14, 15, 64, 255, random.integer(0, 255)]);
      return `header size set to ${bytes[0]}`;
    }
    if (field === 'protocol') {
      bytes[1] = pick(random, [0x00, 0x10, 0x1f, 0x20, 0x21, 0x23, 0x30, 0xff, random.integer(0, 255)]);
      return `protocol version byte set to 0x${bytes[1].toString(16)}`;
    }
    if (field === 'profile') {
      view.setUint16(2, random.integer(0, 0xffff), true);
      return `profile version set to ${view.getUint16(2, true)}`;
    }
    if (field === 'signature') {
      bytes[8 + random.integer(0, 3)] = random.integer(0, 255);
      return `signature changed to ${JSON.stringify(String.fromCharCode(...bytes.subarray(8, 12)))}`;
    }
    const dataSize = view.getUint32(4, true);
    const size = pick(random, [
      0,
      1,
      dataSize - random.integer(1, 64),
      dataSize + random.integer(1, 64),
      bytes.length,
      2 * dataSize,
      0xffffffff,
      random.integer(0, 0xffffffff),
    ]);
    view.setUint32(4, Math.max(0, Math.min(0xffffffff, size)), true);
    return `data size set to ${view.getUint32(4, true)} (was ${dataSize})`;
  },

  definition_field(bytes, layout, random) {
    if (layout.definitions.length === 0) return 'no definition to change';
    const definition = pick(random, layout.definitions);
    const at = definition.at;
    const field = pick(random, [
      'field count',
      'field size',
      'base type',
      'field number',
      'architecture',
      'global number',
      'local type',
      'developer count',
    ] as const);
    const fieldAt = at + 6 + 3 * random.integer(0, Math.max(0, definition.fieldCount - 1));
    switch (field) {
      case 'field count':
        bytes[at + 5] = pick(random, [0, definition.fieldCount - 1, definition.fieldCount + 1, 255, random.integer(0, 255)]) & 0xff;
        return `field count of the definition at byte ${at} set to ${bytes[at + 5]} (was ${definition.fieldCount})`;
      case 'field size':
        bytes[fieldAt + 1] = pick(random, [0, 1, 2, 3, 5, 255, random.integer(0, 255)]);
        return `a field size of the definition at byte ${at} set to ${bytes[fieldAt + 1]}`;
      case 'base type':
        bytes[fieldAt + 2] = random.integer(0, 255);
        return `a base type of the definition at byte ${at} set to 0x${bytes[fieldAt + 2].toString(16)}`;
      case 'field number':
        bytes[fieldAt] = pick(random, [TIMESTAMP_FIELD, 7, 4, 30, 13, random.integer(0, 255)]);
        return `a field number of the definition at byte ${at} set to ${bytes[fieldAt]}`;
      case 'architecture':
        bytes[at + 2] = pick(random, [0, 1, 2, 255]);
        return `architecture of the definition at byte ${at} set to ${bytes[at + 2]}`;
      case 'global number': {
        const number = pick(random, [0, 18, 20, 23, 34, 0xfffe, random.integer(0, 0xffff)]);
        const littleEndian = bytes[at + 2] === 0;
        new DataView(bytes.buffer, bytes.byteOffset).setUint16(at + 3, number, littleEndian);
        return `global message number of the definition at byte ${at} set to ${number}`;
      }
      case 'local type':
        bytes[at] = (bytes[at] & 0xf0) | random.integer(0, 15);
        return `local type of the definition at byte ${at} set to ${bytes[at] & 0x0f}`;
      default: {
        if (!definition.developer) {
          bytes[at] |= 0x20;
          return `developer flag set on the definition at byte ${at}`;
        }
        const countAt = at + 6 + 3 * definition.fieldCount;
        bytes[countAt] = random.integer(0, 255);
        return `developer field count of the definition at byte ${at} set to ${bytes[countAt]}`;
      }
    }
  },

  compressed_header(bytes, layout, random) {
    if (layout.dataHeaders.length === 0) return 'no data message to change';
    const first = random.integer(0, layout.dataHeaders.length - 1);
    const run = Math.min(layout.dataHeaders.length - first, random.chance(0.5) ? 1 : random.integer(2, 200));
    const how = pick(random, ['compress', 'random time bits', 'random header'] as const);
    for (let i = first; i < first + run; i++) {
      const { at, localType } = layout.dataHeaders[i];
      if (how === 'compress') bytes[at] = 0x80 | (localType << 5) | (bytes[at] & 0x80 ? bytes[at] & 0x1f : random.integer(0, 31));
      else if (how === 'random time bits') bytes[at] = 0x80 | (localType << 5) | random.integer(0, 31);
      else bytes[at] = 0x80 | random.integer(0, 127);
    }
    return `${run} record header(s) from byte ${layout.dataHeaders[first].at}: ${how}`;
  },

  extreme_timestamp(bytes, layout, random) {
    if (layout.recordTimestamps.length === 0) return 'no record timestamp to change';
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    const first = random.integer(0, layout.recordTimestamps.length - 1);
    // One record, a few, or every record from here on (a clock that jumped and stayed).
    const extent = pick(random, ['one', 'a few', 'from here on'] as const);
    const last =
      extent === 'one'
        ? first
        : extent === 'a few'
          ? Math.min(layout.recordTimestamps.length - 1, first + random.integer(1, 10))
          : layout.recordTimestamps.length - 1;
    const spot = layout.recordTimestamps[first];
    const original = view.getUint32(spot.at, spot.littleEndian);
    const jump = pick(random, [
      { name: 'set to 0', value: () => 0 },
      { name: 'set to 1', value: () => 1 },
      { name: 'set to the largest valid time', value: () => 0xfffffffe },
      { name: 'set to the invalid value', value: () => 0xffffffff },
      { name: 'set below 0x10000000 (device uptime, not a date)', value: () => random.integer(0, 0x0fffffff) },
      { name: 'moved 49 h on', value: (t: number) => t + 49 * 3600 },
      { name: 'moved a year on', value: (t: number) => t + 365 * FIT_SECONDS_PER_DAY },
      { name: 'moved ten years on', value: (t: number) => t + 3650 * FIT_SECONDS_PER_DAY },
      { name: 'moved a year back', value: (t: number) => t - 365 * FIT_SECONDS_PER_DAY },
      { name: 'moved an hour back', value: (t: number) => t - 3600 },
      { name: 'set to a random time', value: () => random.integer(0, 0xffffffff) },
    ]);
    for (let i = first; i <= last; i++) {
      const { at, littleEndian } = layout.recordTimestamps[i];
      const value = jump.value(view.getUint32(at, littleEndian));
      view.setUint32(at, Math.max(0, Math.min(0xffffffff, value)), littleEndian);
    }
    return `${last - first + 1} record timestamp(s) from byte ${spot.at} (was ${original}) ${jump.name}`;
  },
};

/** Cut at a message boundary (or, now and then, anywhere); with `fixHeader`, the header's data size then says so. */
function truncate(bytes: Uint8Array, layout: FitLayout, random: Random, fixHeader: boolean): { bytes: Uint8Array; step: string } {
  const starts = layout.messageStarts.filter((at) => at < bytes.length);
  const atBoundary = starts.length > 0 && random.chance(0.8);
  const cut = atBoundary ? pick(random, starts) : random.integer(0, bytes.length - 1);
  const where = atBoundary ? `at the message boundary at byte ${cut}` : `at byte ${cut}`;
  if (!fixHeader || cut < 12) return { bytes: bytes.slice(0, cut), step: `file cut ${where}` };
  const out = new Uint8Array(cut + 2);
  out.set(bytes.subarray(0, cut));
  const headerSize = out[0] === 12 || out[0] === 14 ? out[0] : layout.headerSize;
  new DataView(out.buffer).setUint32(4, Math.max(0, cut - headerSize), true);
  return { bytes: out, step: `file cut ${where}, its data size set to match and a checksum appended` };
}

/** The header CRC (when set) and the checksum after the data, where the header says the data ends. */
export function recomputeCrcs(bytes: Uint8Array): void {
  if (bytes.length < 12) return;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const headerSize = bytes[0];
  if (headerSize === 14 && bytes.length >= 14 && view.getUint16(12, true) !== 0) view.setUint16(12, crc16Arc(bytes, 0, 12), true);
  const dataEnd = headerSize + view.getUint32(4, true);
  if (dataEnd + 2 <= bytes.length) view.setUint16(dataEnd, crc16Arc(bytes, 0, dataEnd), true);
}

function pick<T>(random: Random, items: readonly T[]): T {
  return items[random.integer(0, items.length - 1)];
}
