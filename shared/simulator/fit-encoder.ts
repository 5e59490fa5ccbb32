// A small FIT encoder for the handful of messages an activity file needs. It writes
// the same bytes as @garmin/fitsdk's Encoder for the same messages (checked in
// tests/shared/simulator/fit-encoder.test.ts) at a tenth of the cost: the SDK
// encoder looks every field up in its whole profile for every record (measured
// here: ~100 ms for a 2-hour file against ~10 ms), too slow for a demo seed of
// several hundred pairs. It also keeps the SDK's 1.5 MB profile out of browser
// bundles, and the SDK stays a development dependency.

/**
 * FIT base types as written in definition messages, endian flag included (FIT SDK
 * profile). Enums go out as uint8, as the SDK's encoder writes them: same size and
 * invalid value, and decoders read enums through the profile.
 */
const BASE_TYPE = {
  enum: 0x02,
  uint8: 0x02,
  string: 0x07,
  uint16: 0x84,
  sint32: 0x85,
  uint32: 0x86,
  uint32z: 0x8c,
} as const;
type BaseType = keyof typeof BASE_TYPE;

const BASE_TYPE_SIZE: Record<BaseType, number> = { enum: 1, uint8: 1, string: 1, uint16: 2, sint32: 4, uint32: 4, uint32z: 4 };

interface FieldSpec {
  num: number;
  baseType: BaseType;
  /** Raw = value × scale, as the FIT profile defines it. */
  scale?: number;
}

/** Global message numbers (FIT SDK profile, MesgNum). */
export const MESG_NUM = { fileId: 0, session: 18, lap: 19, record: 20, event: 21, deviceInfo: 23, activity: 34 } as const;

// Field numbers, base types and scales from the FIT SDK profile (21.217); the
// test compares this table with @garmin/fitsdk's Profile.
const DATE_TIME: FieldSpec = { num: 253, baseType: 'uint32' };
const MESSAGE_INDEX: FieldSpec = { num: 254, baseType: 'uint16' };
const SECONDS_MS: Pick<FieldSpec, 'baseType' | 'scale'> = { baseType: 'uint32', scale: 1000 };

export const FIELDS: Record<number, Record<string, FieldSpec>> = {
  [MESG_NUM.fileId]: {
    type: { num: 0, baseType: 'enum' },
    manufacturer: { num: 1, baseType: 'uint16' },
    product: { num: 2, baseType: 'uint16' },
    serialNumber: { num: 3, baseType: 'uint32z' },
    timeCreated: { num: 4, baseType: 'uint32' },
    productName: { num: 8, baseType: 'string' },
  },
  [MESG_NUM.deviceInfo]: {
    timestamp: DATE_TIME,
    deviceIndex: { num: 0, baseType: 'uint8' },
    deviceType: { num: 1, baseType: 'uint8' },
    manufacturer: { num: 2, baseType: 'uint16' },
    serialNumber: { num: 3, baseType: 'uint32z' },
    product: { num: 4, baseType: 'uint16' },
    softwareVersion: { num: 5, baseType: 'uint16', scale: 100 },
    sourceType: { num: 25, baseType: 'enum' },
    productName: { num: 27, baseType: 'string' },
  },
  [MESG_NUM.event]: {
    timestamp: DATE_TIME,
    event: { num: 0, baseType: 'enum' },
    eventType: { num: 1, baseType: 'enum' },
  },
  [MESG_NUM.record]: {
    timestamp: DATE_TIME,
    positionLat: { num: 0, baseType: 'sint32' },
    positionLong: { num: 1, baseType: 'sint32' },
    cadence: { num: 4, baseType: 'uint8' },
    power: { num: 7, baseType: 'uint16' },
    leftRightBalance: { num: 30, baseType: 'uint8' },
  },
  [MESG_NUM.lap]: {
    messageIndex: MESSAGE_INDEX,
    timestamp: DATE_TIME,
    event: { num: 0, baseType: 'enum' },
    eventType: { num: 1, baseType: 'enum' },
    startTime: { num: 2, baseType: 'uint32' },
    totalElapsedTime: { num: 7, ...SECONDS_MS },
    totalTimerTime: { num: 8, ...SECONDS_MS },
    avgCadence: { num: 17, baseType: 'uint8' },
    maxCadence: { num: 18, baseType: 'uint8' },
    avgPower: { num: 19, baseType: 'uint16' },
    maxPower: { num: 20, baseType: 'uint16' },
    lapTrigger: { num: 24, baseType: 'enum' },
    sport: { num: 25, baseType: 'enum' },
    subSport: { num: 39, baseType: 'enum' },
  },
  [MESG_NUM.session]: {
    messageIndex: MESSAGE_INDEX,
    timestamp: DATE_TIME,
    event: { num: 0, baseType: 'enum' },
    eventType: { num: 1, baseType: 'enum' },
    startTime: { num: 2, baseType: 'uint32' },
    sport: { num: 5, baseType: 'enum' },
    subSport: { num: 6, baseType: 'enum' },
    totalElapsedTime: { num: 7, ...SECONDS_MS },
    totalTimerTime: { num: 8, ...SECONDS_MS },
    avgCadence: { num: 18, baseType: 'uint8' },
    maxCadence: { num: 19, baseType: 'uint8' },
    avgPower: { num: 20, baseType: 'uint16' },
    maxPower: { num: 21, baseType: 'uint16' },
    firstLapIndex: { num: 25, baseType: 'uint16' },
    numLaps: { num: 26, baseType: 'uint16' },
    trigger: { num: 28, baseType: 'enum' },
  },
  [MESG_NUM.activity]: {
    timestamp: DATE_TIME,
    totalTimerTime: { num: 0, ...SECONDS_MS },
    numSessions: { num: 1, baseType: 'uint16' },
    type: { num: 2, baseType: 'enum' },
    event: { num: 3, baseType: 'enum' },
    eventType: { num: 4, baseType: 'enum' },
    localTimestamp: { num: 5, baseType: 'uint32' },
  },
};

/** A message as field name → value (profile units; strings for string fields). Undefined fields are left out. */
export type FitMessage = Record<string, number | string | undefined>;

const HEADER_SIZE = 14;
/** Written like the SDK does: major × 1000 + minor for profile 21.217. */
const PROFILE_VERSION = 21217;
const PROTOCOL_VERSION = 0x20; // 2.0
const LOCAL_MESSAGE_TYPES = 16;
const textEncoder = new TextEncoder();

interface Definition {
  key: string;
  fields: Array<{ name: string; spec: FieldSpec; size: number }>;
}

export function createFitEncoder() {
  let bytes = new Uint8Array(64 * 1024);
  let view = new DataView(bytes.buffer);
  let length = HEADER_SIZE;
  // The SDK's scheme: reuse a local type whose definition matches, else take the next one round-robin.
  const active: Array<string | null> = new Array(LOCAL_MESSAGE_TYPES).fill(null);
  let nextLocal = 0;

  const reserve = (count: number) => {
    if (length + count <= bytes.length) return;
    const grown = new Uint8Array(Math.max(bytes.length * 2, length + count));
    grown.set(bytes.subarray(0, length));
    bytes = grown;
    view = new DataView(bytes.buffer);
  };
  const writeByte = (value: number) => {
    reserve(1);
    bytes[length++] = value;
  };

  const define = (mesgNum: number, message: FitMessage): Definition => {
    const specs = FIELDS[mesgNum];
    const fields: Definition['fields'] = [];
    let key = `${mesgNum}`;
    for (const name of Object.keys(message)) {
      const value = message[name];
      const spec = specs[name];
      if (value === undefined || value === null || !spec) continue;
      const size = spec.baseType === 'string' ? textEncoder.encode(String(value)).length + 1 : BASE_TYPE_SIZE[spec.baseType];
      fields.push({ name, spec, size });
      key += `|${spec.num}:${size}:${spec.baseType}`;
    }
    return { key, fields };
  };

  const writeDefinition = (local: number, mesgNum: number, definition: Definition) => {
    reserve(6 + 3 * definition.fields.length);
    bytes[length++] = 0x40 | local; // definition message header
    bytes[length++] = 0; // reserved
    bytes[length++] = 0; // little-endian
    view.setUint16(length, mesgNum, true);
    length += 2;
    bytes[length++] = definition.fields.length;
    for (const field of definition.fields) {
      bytes[length++] = field.spec.num;
      bytes[length++] = field.size;
      bytes[length++] = BASE_TYPE[field.spec.baseType];
    }
  };

  const writeValue = (spec: FieldSpec, size: number, value: number | string) => {
    reserve(size);
    if (spec.baseType === 'string') {
      const encoded = textEncoder.encode(String(value));
      bytes.set(encoded, length);
      bytes[length + encoded.length] = 0;
      length += size;
      return;
    }
    const raw = spec.scale ? Math.round(Number(value) * spec.scale) : Number(value);
    switch (spec.baseType) {
      case 'enum':
      case 'uint8':
        view.setUint8(length, raw);
        break;
      case 'uint16':
        view.setUint16(length, raw, true);
        break;
      case 'sint32':
        view.setInt32(length, raw, true);
        break;
      case 'uint32':
      case 'uint32z':
        view.setUint32(length, raw, true);
        break;
    }
    length += size;
  };

  return {
    write(mesgNum: number, message: FitMessage): void {
      const definition = define(mesgNum, message);
      let local = active.indexOf(definition.key);
      if (local === -1) {
        local = nextLocal;
        nextLocal = (nextLocal + 1) % LOCAL_MESSAGE_TYPES;
      }
      if (active[local] !== definition.key) {
        writeDefinition(local, mesgNum, definition);
        active[local] = definition.key;
      }
      writeByte(local);
      for (const field of definition.fields) writeValue(field.spec, field.size, message[field.name] as number | string);
    },

    /** Finishes the file: header with its CRC, data, file CRC. */
    close(): Uint8Array {
      const dataSize = length - HEADER_SIZE;
      bytes[0] = HEADER_SIZE;
      bytes[1] = PROTOCOL_VERSION;
      view.setUint16(2, PROFILE_VERSION, true);
      view.setUint32(4, dataSize, true);
      bytes.set([0x2e, 0x46, 0x49, 0x54], 8); // ".FIT"
      view.setUint16(12, fitCrc(bytes, 0, 12), true);
      const crc = fitCrc(bytes, 0, length);
      reserve(2);
      view.setUint16(length, crc, true);
      length += 2;
      return bytes.slice(0, length);
    },
  };
}

// FIT's CRC is CRC-16/ARC, computed a nibble at a time with this table (FIT SDK,
// FIT protocol document, "File CRC").
const CRC_TABLE = [
  0x0000, 0xcc01, 0xd801, 0x1400, 0xf001, 0x3c00, 0x2800, 0xe401, 0xa001, 0x6c00, 0x7800, 0xb401, 0x5000, 0x9c01, 0x8801, 0x4400,
];

export function fitCrc(data: Uint8Array, start = 0, end = data.length): number {
  let crc = 0;
  for (let i = start; i < end; i += 1) {
    const byte = data[i];
    let tmp = CRC_TABLE[crc & 0xf];
    crc = (crc >> 4) & 0x0fff;
    crc = crc ^ tmp ^ CRC_TABLE[byte & 0xf];
    tmp = CRC_TABLE[crc & 0xf];
    crc = (crc >> 4) & 0x0fff;
    crc = crc ^ tmp ^ CRC_TABLE[(byte >> 4) & 0xf];
  }
  return crc;
}
