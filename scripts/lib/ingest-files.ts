// The FIT files of the ingest benchmark (npm run bench:ingest), from 0.1 MiB to
// the upload limit: activities of ordinary records (timestamp, power, cadence,
// balance, heart rate, speed, distance, altitude; 18 bytes each) at 1 to 16 records
// a second, a day at 1 Hz from the simulator (the FIT SDK's Encoder), and files of
// 3-byte records at and far beyond the record cap.
import { MAX_RECORDS_PER_FILE } from '@shared/analysis/decode-fit';
import { MAX_FIT_FILE_BYTES } from '@shared/limits';
import { simulatePair } from '@shared/simulator/pair';
import { BASE, FILE_TYPE, FIT_EPOCH, FitBytes, fitFile, MESG, tinyRecordFile } from './fit-bytes';

export interface IngestFile {
  label: string;
  bytes: Uint8Array;
  /** Our decoder should refuse it with this code (the record cap); undefined = it should read. */
  refusal?: 'too_many_records';
}

const MiB = 1024 * 1024;
const START = Date.UTC(2024, 5, 1, 5) / 1000;
const RECORD_BYTES = 18;

/**
 * `records` records at `perSecond` a second, power following a slow wave and noise
 * from `seed`, so two files of one ride differ as two meters would.
 */
export function denseActivity(options: { records: number; perSecond: number; seed?: number; scale?: number }): Uint8Array {
  const head = new FitBytes()
    .define(0, MESG.fileId, [
      [0, BASE.enum],
      [1, BASE.uint16],
      [2, BASE.uint16],
      [3, BASE.uint32z],
      [4, BASE.uint32],
    ])
    .data(0, [FILE_TYPE.activity, 255, 1, 4000 + (options.seed ?? 0), START - FIT_EPOCH])
    .define(1, MESG.record, [
      [253, BASE.uint32],
      [7, BASE.uint16],
      [4, BASE.uint8],
      [30, BASE.uint8],
      [3, BASE.uint8],
      [6, BASE.uint16],
      [5, BASE.uint32],
      [2, BASE.uint16],
    ]);
  const headBytes = head.toFile().subarray(14, -2);
  const data = new Uint8Array(headBytes.length + options.records * RECORD_BYTES);
  data.set(headBytes);
  const view = new DataView(data.buffer);
  let noise = options.seed ?? 1;
  const scale = options.scale ?? 1;
  for (let i = 0, at = headBytes.length; i < options.records; i++, at += RECORD_BYTES) {
    const second = Math.floor(i / options.perSecond);
    noise = (Math.imul(noise, 1103515245) + 12345) >>> 0; // an LCG: cheap, repeatable noise
    const watts = Math.round(scale * (200 + 60 * Math.sin(second / 300)) + ((noise >>> 16) % 21) - 10);
    data[at] = 1;
    view.setUint32(at + 1, START - FIT_EPOCH + second, true);
    view.setUint16(at + 5, watts, true);
    data[at + 7] = 88 + (second % 7);
    data[at + 8] = 0x80 | 50;
    data[at + 9] = 140;
    view.setUint16(at + 10, 8000, true);
    view.setUint32(at + 12, second * 800, true);
    view.setUint16(at + 16, 2500, true);
  }
  return fitFile(data);
}

/** Records for a file of about `mebibytes` MiB. */
export function recordsFor(mebibytes: number): number {
  return Math.floor((mebibytes * MiB - 32) / RECORD_BYTES);
}

export function ingestFiles(): IngestFile[] {
  const day = 24 * 3600;
  const largest = Math.min(recordsFor(MAX_FIT_FILE_BYTES / MiB), 16 * day);
  return [
    { label: '0.1 MiB, 1 record/s', bytes: denseActivity({ records: recordsFor(0.1), perSecond: 1 }) },
    { label: '1 MiB, 1 record/s', bytes: denseActivity({ records: recordsFor(1), perSecond: 1 }) },
    { label: '5 MiB, 4 records/s', bytes: denseActivity({ records: recordsFor(5), perSecond: 4 }) },
    { label: '12 MiB, 8 records/s', bytes: denseActivity({ records: recordsFor(12), perSecond: 8 }) },
    { label: '24 h at 16 records/s (the upload limit)', bytes: denseActivity({ records: largest, perSecond: 16 }) },
    {
      label: '24 h at 1 Hz, simulator (SDK Encoder)',
      bytes: simulatePair({ seed: 13, durationSeconds: day, a: { position: 'dual' }, b: { position: 'total' } }).a,
    },
    {
      label: `${(MAX_RECORDS_PER_FILE - 1).toLocaleString('en-GB')} 3-byte records at 16/s (just under the cap)`,
      bytes: tinyRecordFile(MAX_RECORDS_PER_FILE - 1, START, 16),
    },
    {
      label: '3-byte records up to the upload limit (over the cap)',
      bytes: tinyRecordFile(Math.floor((MAX_FIT_FILE_BYTES - 64) / 3)),
      refusal: 'too_many_records',
    },
  ];
}

/** A pair of one 24-hour ride at 16 records/s, each file just under the upload limit; A reads 2 % high. */
export function largestPair(): { a: Uint8Array; b: Uint8Array } {
  const records = Math.min(recordsFor(MAX_FIT_FILE_BYTES / MiB), 16 * 24 * 3600);
  return { a: denseActivity({ records, perSecond: 16, seed: 7, scale: 1.02 }), b: denseActivity({ records, perSecond: 16, seed: 8 }) };
}
