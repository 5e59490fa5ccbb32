// The differential corpus: FIT files in every variant the decoder must read, most of
// them written by @garmin/fitsdk's Encoder, the rest built byte by byte (fit-bytes.ts)
// where the SDK writes no such thing. The tests check each against the SDK's Decoder;
// the fuzzer (npm run fuzz:fit) mutates them.
import { Encoder, Profile } from '@garmin/fitsdk';
import { crc16Arc } from '@shared/analysis/fit-crc';
import { simulatePair } from '@shared/simulator/pair';
import { encodeActivityWithGps, withShortHeader, withZeroHeaderCrc } from '../fit/gps-fit-files';
import { BASE, chain, FILE_TYPE, FIT_EPOCH, FitBytes, MESG } from '../../../scripts/lib/fit-bytes';

const M = Profile.MesgNum;
type SdkMesg = Parameters<Encoder['onMesg']>[1];
const START = 1_717_225_200 - FIT_EPOCH; // 2024-06-01T07:00:00Z in FIT seconds

export interface CorpusFile {
  name: string;
  bytes: Uint8Array;
}

/** Sets the header's protocol-version byte, keeping both CRCs right. */
export function withProtocolVersion(file: Uint8Array, version: number): Uint8Array {
  const out = file.slice();
  const view = new DataView(out.buffer);
  out[1] = version;
  if (out[0] === 14) view.setUint16(12, crc16Arc(out, 0, 12), true);
  view.setUint16(out.length - 2, crc16Arc(out, 0, out.length - 2), true);
  return out;
}

function sdkFile(write: (mesg: (num: number, fields: Record<string, unknown>) => void) => void): Uint8Array {
  const encoder = new Encoder();
  write((num, fields) => encoder.onMesg(num, fields as SdkMesg));
  return encoder.close();
}

/** Records written out of time order (a unit that buffers and flushes late), 20 minutes. */
export function outOfOrderFile(): Uint8Array {
  return sdkFile((mesg) => {
    mesg(M.FILE_ID, { type: 'activity', manufacturer: 'development', product: 1, serialNumber: 11, timeCreated: START });
    for (let i = 0; i < 1200; i++) {
      // Every 50 s a block of 5 records arrives 10 s late, after later ones; two records share a second.
      const shuffled = i % 50 < 5 ? i + 10 : i % 50 < 15 ? i - 5 : i;
      mesg(M.RECORD, { timestamp: START + (i === 600 ? 599 : shuffled), power: 150 + (i % 97), cadence: 85 + (i % 7) });
    }
  });
}

/**
 * The power meter is described at the start before it sent its serial number and
 * software version, then completely, then with its battery low: its identity must
 * come from the complete messages, and every message's battery report is kept.
 */
export function deviceDescribedTwiceFile(): Uint8Array {
  return sdkFile((mesg) => {
    mesg(M.FILE_ID, { type: 'activity', manufacturer: 'development', product: 3, serialNumber: 33, timeCreated: START });
    mesg(M.DEVICE_INFO, {
      timestamp: START,
      deviceIndex: 0,
      manufacturer: 'development',
      product: 3,
      serialNumber: 33,
      softwareVersion: 5.1,
    });
    mesg(M.DEVICE_INFO, { timestamp: START, deviceIndex: 1, deviceType: 11, sourceType: 1, antDeviceNumber: 4711 });
    for (let i = 0; i < 1200; i++) {
      mesg(M.RECORD, { timestamp: START + i, power: 200 + (i % 30), cadence: 90, temperature: 18 + Math.floor(i / 600) });
      if (i === 60) {
        mesg(M.DEVICE_INFO, {
          timestamp: START + i,
          deviceIndex: 1,
          deviceType: 11,
          sourceType: 1,
          antDeviceNumber: 4711,
          manufacturer: 'development',
          product: 9,
          serialNumber: 515151,
          softwareVersion: 1.05,
          batteryVoltage: 3.0,
          batteryStatus: 'good',
          cumOperatingTime: 36000,
        });
      }
    }
    mesg(M.DEVICE_INFO, {
      timestamp: START + 1200,
      deviceIndex: 1,
      deviceType: 11,
      sourceType: 1,
      batteryVoltage: 2.5,
      batteryStatus: 'low',
      cumOperatingTime: 37200,
    });
    mesg(M.SESSION, { timestamp: START + 1200, startTime: START, sport: 'cycling', totalElapsedTime: 1200 });
  });
}

/** Big-endian definitions throughout (the protocol allows either byte order per message). */
export function bigEndianFile(seconds = 1200): Uint8Array {
  const fit = new FitBytes()
    .define(
      0,
      MESG.fileId,
      [
        [0, BASE.enum],
        [1, BASE.uint16],
        [2, BASE.uint16],
        [3, BASE.uint32z],
        [4, BASE.uint32],
      ],
      { bigEndian: true },
    )
    .data(0, [FILE_TYPE.activity, 255, 2, 4343, START])
    .define(
      1,
      MESG.deviceInfo,
      [
        [253, BASE.uint32],
        [0, BASE.uint8],
        [1, BASE.uint8],
        [2, BASE.uint16],
        [3, BASE.uint32z],
        [4, BASE.uint16],
        [5, BASE.uint16],
        [25, BASE.enum],
      ],
      { bigEndian: true },
    )
    .data(1, [START, 1, 11, 255, 626262, 12, 207, 1])
    .define(
      2,
      MESG.record,
      [
        [253, BASE.uint32],
        [7, BASE.uint16],
        [4, BASE.uint8],
        [30, BASE.uint8],
        [13, BASE.sint8],
      ],
      { bigEndian: true },
    );
  for (let i = 0; i < seconds; i++)
    fit.data(2, [START + i, i % 300 === 7 ? null : 180 + (i % 61), 80 + (i % 9), 0x80 | (48 + (i % 5)), -3 + (i % 4)]);
  return fit.toFile();
}

/** Developer fields in the records' definition (written by the SDK's Encoder). */
export function developerFieldFile(): Uint8Array {
  return encodeActivityWithGps({ seconds: 900 });
}

/**
 * Records with compressed timestamp headers (FIT protocol 4.1.2): after one full
 * timestamp, each record carries only the low five bits of its time. The SDK cannot
 * read these; `times` are the Unix seconds the protocol's rule gives.
 */
export function compressedTimestampFile(seconds = 1200): { bytes: Uint8Array; times: number[]; power: number[] } {
  const fit = new FitBytes()
    .define(0, MESG.fileId, [
      [0, BASE.enum],
      [4, BASE.uint32],
    ])
    .data(0, [FILE_TYPE.activity, START])
    .define(1, MESG.record, [
      [253, BASE.uint32],
      [7, BASE.uint16],
    ])
    .data(1, [START, 100])
    .define(3, MESG.record, [
      [7, BASE.uint16],
      [4, BASE.uint8],
    ]);
  const times = [START];
  const power = [100];
  // Steps of 1 to 3 s cross the 32-second rollover of the five bits many times.
  let time = START;
  for (let i = 1; i < seconds; i++) {
    time += 1 + (i % 3);
    times.push(time);
    power.push(120 + (i % 80));
    fit.data(3, [120 + (i % 80), 90], { compressedTime: time });
  }
  return { bytes: fit.toFile(), times: times.map((t) => t + FIT_EPOCH), power };
}

/** Every variant the SDK's Decoder reads, by name. */
export function sdkReadableCorpus(): CorpusFile[] {
  const pair = simulatePair({
    seed: 41,
    durationSeconds: 1500,
    startTime: START + FIT_EPOCH,
    a: { position: 'total', recordingMode: 'change-only', powerDropoutsPerHour: 4, includeLocation: true },
    b: { position: 'dual', clockOffsetSeconds: 9 },
  });
  const later = simulatePair({
    seed: 42,
    durationSeconds: 900,
    startTime: START + FIT_EPOCH + 1800,
    a: { position: 'total' },
    b: { position: 'total' },
  });
  return [
    { name: "the simulator's file A (SDK Encoder, change-only recording, GPS)", bytes: pair.a },
    { name: "the simulator's file B (SDK Encoder, dual meter with balance)", bytes: pair.b },
    { name: '12-byte header', bytes: withShortHeader(pair.b) },
    { name: '14-byte header with CRC 0', bytes: withZeroHeaderCrc(pair.b) },
    ...[0x10, 0x20, 0x21, 0x23].map((version) => ({
      name: `protocol version byte 0x${version.toString(16)}`,
      bytes: withProtocolVersion(pair.b, version),
    })),
    { name: 'developer fields', bytes: developerFieldFile() },
    { name: 'big-endian definitions', bytes: bigEndianFile() },
    { name: 'two files chained', bytes: chain(pair.a, later.a) },
    { name: 'records out of order', bytes: outOfOrderFile() },
    { name: 'power meter described twice', bytes: deviceDescribedTwiceFile() },
  ];
}
