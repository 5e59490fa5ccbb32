// Test fixtures: FIT files with GPS in every place the profile has coordinates,
// written by @garmin/fitsdk's Encoder (the reference implementation), and the
// variants the SDK does not write (12-byte header, header CRC of 0, compressed
// timestamps, big-endian messages, chained files), derived from them by hand.
import { Encoder, Profile } from '@garmin/fitsdk';
import { crc16Arc } from '@shared/analysis/fit-crc';

const FIT_EPOCH_UNIX_SECONDS = 631065600; // FIT SDK profile: Unix = FIT + 631065600
const START = Date.UTC(2024, 4, 12, 7, 30) / 1000 - FIT_EPOCH_UNIX_SECONDS;
const M = Profile.MesgNum;
type SdkMesg = Parameters<Encoder['onMesg']>[1];

/** Degrees → semicircles (FIT SDK profile: 2^31 semicircles = 180°). */
export const semicircles = (degrees: number) => Math.round((degrees * 2 ** 31) / 180);
const LAT = semicircles(46.2);
const LONG = semicircles(7.35);

/** FIT base type numbers (FIT SDK profile, fit_base_type). */
const BASE_TYPE = { uint8: 0x02, uint16: 0x84, sint32: 0x85, float32: 0x88 } as const;

/** Developer fields: three are positions (by name, by name, by native field), two are not. */
const DEVELOPER_FIELDS = [
  { fitBaseTypeId: BASE_TYPE.sint32, fieldName: 'gps_latitude', units: 'degrees' },
  { fitBaseTypeId: BASE_TYPE.float32, fieldName: 'Longitude', units: 'deg' },
  { fitBaseTypeId: BASE_TYPE.sint32, fieldName: 'track_point', nativeMesgNum: M.RECORD, nativeFieldNum: 0 },
  { fitBaseTypeId: BASE_TYPE.uint8, fieldName: 'saddle_position', units: 'enum' },
  { fitBaseTypeId: BASE_TYPE.uint16, fieldName: 'core_temperature', units: 'C' },
];
/** Developer field keys that hold positions. */
export const POSITION_DEVELOPER_KEYS = [0, 1, 2];

/** An activity with coordinates in records, laps, the session, course, segment and gps messages and developer fields. */
export function encodeActivityWithGps(options: { seconds?: number; seed?: number } = {}): Uint8Array {
  const seconds = options.seconds ?? 600;
  const seed = options.seed ?? 1;
  const developerDataIdMesg = { developerDataIndex: 0, applicationVersion: 3 };
  const fieldDescriptions = Object.fromEntries(
    DEVELOPER_FIELDS.map((field, key) => [
      key,
      { developerDataIdMesg, fieldDescriptionMesg: { developerDataIndex: 0, fieldDefinitionNumber: key, ...field } },
    ]),
  );
  const encoder = new Encoder({ fieldDescriptions } as ConstructorParameters<typeof Encoder>[0]);
  // Messages as plain objects: the SDK's message types do not list every field by name.
  const write = (mesgNum: number, mesg: Record<string, unknown>) => encoder.onMesg(mesgNum, mesg as SdkMesg);
  write(M.FILE_ID, { type: 'activity', manufacturer: 'development', product: 7, serialNumber: 4242 + seed, timeCreated: START });
  write(M.DEVELOPER_DATA_ID, developerDataIdMesg);
  // The SDK encodes developer fields with these descriptions; the file must carry them too.
  for (const { fieldDescriptionMesg } of Object.values(fieldDescriptions)) write(M.FIELD_DESCRIPTION, fieldDescriptionMesg);
  write(M.DEVICE_INFO, {
    timestamp: START,
    deviceIndex: 0,
    manufacturer: 'development',
    product: 7,
    serialNumber: 4242,
    softwareVersion: 4.1,
  });
  write(M.EVENT, { timestamp: START, event: 'timer', eventType: 'start' });
  write(M.COURSE_POINT, { timestamp: START + 60, positionLat: LAT + 500, positionLong: LONG - 500, type: 'summit', name: 'Col' });
  write(M.SEGMENT_POINT, { messageIndex: 0, positionLat: LAT + 700, positionLong: LONG + 700, distance: 120 });
  write(M.GPS_METADATA, {
    timestamp: START + 1,
    positionLat: LAT,
    positionLong: LONG,
    enhancedAltitude: 512,
    enhancedSpeed: 7.5,
    heading: 90,
  });
  write(M.WEATHER_CONDITIONS, {
    timestamp: START,
    observedLocationLat: LAT,
    observedLocationLong: LONG,
    temperature: 18,
    location: 'Alpbach',
  });
  for (let i = 0; i < seconds; i++) {
    write(M.RECORD, {
      timestamp: START + i,
      positionLat: LAT + i * 37 * seed,
      positionLong: LONG - i * 29,
      altitude: 500 + i / 10,
      power: 150 + ((i * 7 + seed) % 90),
      cadence: 80 + (i % 12),
      heartRate: 120 + (i % 30),
      temperature: 17,
      developerFields: { 0: LAT + i, 1: 7.35 + i / 1e5, 2: LAT - i, 3: i % 2, 4: 3700 + (i % 5) },
    });
  }
  const box = { necLat: LAT + 9000, necLong: LONG + 9000, swcLat: LAT - 9000, swcLong: LONG - 9000 };
  const ends = { startPositionLat: LAT, startPositionLong: LONG, endPositionLat: LAT + 1, endPositionLong: LONG + 1 };
  write(M.EVENT, { timestamp: START + seconds, event: 'timer', eventType: 'stopAll' });
  write(M.SEGMENT_LAP, {
    messageIndex: 0,
    timestamp: START + seconds,
    startTime: START,
    ...ends,
    ...box,
    totalElapsedTime: seconds,
    name: 'Climb',
  });
  write(M.LAP, {
    messageIndex: 0,
    timestamp: START + seconds,
    startTime: START,
    ...ends,
    ...box,
    totalElapsedTime: seconds,
    avgPower: 190,
  });
  write(M.SESSION, {
    messageIndex: 0,
    timestamp: START + seconds,
    startTime: START,
    ...ends,
    ...box,
    sport: 'cycling',
    totalElapsedTime: seconds,
    avgPower: 190,
  });
  write(M.ACTIVITY, { timestamp: START + seconds, numSessions: 1, type: 'manual', event: 'activity', eventType: 'stop' });
  return encoder.close();
}

/** The same file with a 12-byte header (no header CRC), as older devices write. */
export function withShortHeader(file: Uint8Array): Uint8Array {
  const out = new Uint8Array(file.length - 2);
  out.set(file.subarray(0, 12));
  out[0] = 12;
  out.set(file.subarray(14), 12);
  return withFileCrc(out);
}

/** The same file with its 14-byte header's CRC set to 0, which the protocol allows. */
export function withZeroHeaderCrc(file: Uint8Array): Uint8Array {
  const out = file.slice();
  out[12] = 0;
  out[13] = 0;
  return withFileCrc(out);
}

export function withFileCrc(file: Uint8Array): Uint8Array {
  const dataEnd = file.length - 2;
  new DataView(file.buffer, file.byteOffset, file.byteLength).setUint16(dataEnd, crc16Arc(file, 0, dataEnd), true);
  return file;
}

/** Two files one after the other, as some devices chain them. */
export function chained(...files: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(files.reduce((n, f) => n + f.length, 0));
  let offset = 0;
  for (const file of files) {
    out.set(file, offset);
    offset += file.length;
  }
  return out;
}

/**
 * A file the SDK's Encoder cannot write: a file_id, then records in big-endian
 * byte order whose timestamps ride in compressed-timestamp headers (FIT protocol,
 * section 4.4), with a position, power and cadence each. Neither the SDK's Decoder
 * nor fit-file-parser reads these (both refuse compressed timestamps without a
 * timestamp field), so it says where its position bytes are.
 */
export function encodeCompressedTimestampFile(seconds = 40): { bytes: Uint8Array; positionOffsets: number[] } {
  const body: number[] = [];
  const positionOffsets: number[] = [];
  const position = (value: number) => {
    positionOffsets.push(14 + body.length);
    return u32be(value);
  };
  const u16be = (v: number) => [(v >> 8) & 0xff, v & 0xff];
  const u32be = (v: number) => [(v >>> 24) & 0xff, (v >>> 16) & 0xff, (v >>> 8) & 0xff, v & 0xff];
  // Definition, local 0: file_id (big-endian): type enum, manufacturer uint16, time_created uint32.
  body.push(0x40, 0, 1, ...u16be(M.FILE_ID), 3, 0, 1, 0x00, 1, 2, 0x84, 4, 4, 0x86);
  body.push(0x00, 4, ...u16be(255), ...u32be(START));
  // Definition, local 1: record with a full timestamp, to set the reference time.
  body.push(0x41, 0, 1, ...u16be(M.RECORD), 4, 253, 4, 0x86, 0, 4, 0x85, 1, 4, 0x85, 7, 2, 0x84);
  body.push(0x01, ...u32be(START));
  body.push(...position(LAT));
  body.push(...position(LONG), ...u16be(200));
  // Definition, local 2: record without a timestamp field, for compressed-timestamp headers.
  body.push(0x42, 0, 1, ...u16be(M.RECORD), 4, 0, 4, 0x85, 1, 4, 0x85, 7, 2, 0x84, 4, 1, 0x02);
  for (let i = 1; i < seconds; i++) {
    const header = 0x80 | (2 << 5) | ((START + i) & 0x1f);
    body.push(header);
    body.push(...position(LAT + i * 50));
    body.push(...position(LONG + i * 40), ...u16be(180 + i), 85 + (i % 5));
  }
  const file = new Uint8Array(14 + body.length + 2);
  const view = new DataView(file.buffer);
  view.setUint8(0, 14);
  view.setUint8(1, 0x20); // protocol 2.0
  view.setUint16(2, 21217, true); // profile version
  view.setUint32(4, body.length, true);
  file.set([0x2e, 0x46, 0x49, 0x54], 8);
  view.setUint16(12, crc16Arc(file, 0, 12), true);
  file.set(body, 14);
  return { bytes: withFileCrc(file), positionOffsets };
}
