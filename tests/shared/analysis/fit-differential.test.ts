import { describe, expect, it } from 'vitest';
import { decodeFit, readRideStream } from '@shared/analysis/decode-fit';
import { AnalysisError } from '@shared/analysis/errors';
import { readWithFitSdk } from '../../../scripts/lib/fit-sdk-reference';
import { compressedTimestampFile, deviceDescribedTwiceFile, sdkReadableCorpus } from './fit-corpus';
import { BASE, chain, FILE_TYPE, FitBytes, fitFile, MESG } from '../../../scripts/lib/fit-bytes';

const corpus = sdkReadableCorpus();

function refusal(bytes: Uint8Array): AnalysisError {
  try {
    readRideStream(bytes);
  } catch (error) {
    if (error instanceof AnalysisError) return error;
    throw error;
  }
  throw new Error('expected the file to be refused');
}

describe('decoder against the FIT SDK Decoder, record for record', () => {
  it.each(corpus)('when the file has $name, then timestamps, power, cadence, balance and temperature equal the reference', ({ bytes }) => {
    const reference = readWithFitSdk(bytes);
    if (!reference.readable) throw new Error(`the SDK should read this file: ${reference.reason}`);

    const stream = readRideStream(bytes);

    expect(stream.timestamps.length).toBe(reference.records.timestamps.length);
    expect(stream.timestamps.length).toBeGreaterThan(100);
    expect(Array.from(stream.timestamps)).toEqual(reference.records.timestamps);
    expect(Array.from(stream.powerWatts)).toEqual(reference.records.power);
    expect(Array.from(stream.cadenceRpm)).toEqual(reference.records.cadence);
    expect(Array.from(stream.rightBalancePercent)).toEqual(reference.records.rightBalance);
    expect(Array.from(stream.temperatureCelsius ?? stream.timestamps.map(() => NaN))).toEqual(reference.records.temperature);
  });

  it('when two files are chained, then the records of both parts are read', () => {
    const chained = corpus.find((file) => file.name === 'two files chained')!;
    const first = corpus[0];

    const stream = decodeFit(chained.bytes);

    expect(stream.timestamps.length).toBeGreaterThan(decodeFit(first.bytes).timestamps.length);
    expect(stream.recording.endTime - stream.recording.startTime).toBeGreaterThan(2600);
  });
});

describe('compressed timestamp headers, against the protocol definition', () => {
  it('when records carry only the low five bits of their time, then each time is the last time with those bits replaced, rolling over past 32 s', () => {
    // FIT protocol 4.1.2: t = last − (last & 0x1F) + offset, plus 0x20 when offset < (last & 0x1F).
    const { bytes, times, power } = compressedTimestampFile();

    const stream = decodeFit(bytes);

    expect(Array.from(stream.timestamps)).toEqual(times);
    expect(Array.from(stream.powerWatts)).toEqual(power);
  });

  it('when the SDK meets the same file, then it refuses it (it does not support compressed timestamps), so the protocol is the reference', () => {
    expect(readWithFitSdk(compressedTimestampFile().bytes)).toMatchObject({
      readable: false,
      reason: expect.stringMatching(/compressed timestamp/),
    });
  });
});

describe('device identity and battery reports', () => {
  it('when the power meter is first described incompletely, then its identity comes from its complete messages', () => {
    const stream = decodeFit(deviceDescribedTwiceFile());

    expect(stream.device.powerMeter).toEqual({ manufacturerId: 255, productId: 9, serialNumber: 515151, softwareVersion: 1.05 });
    expect(stream.device.creator).toEqual({ manufacturerId: 255, productId: 3, serialNumber: 33, softwareVersion: 5.1 });
  });

  it('when the power meter reports its battery, then every one of its device messages is kept with volts (scale 256) and operating time', () => {
    const stream = decodeFit(deviceDescribedTwiceFile());

    // FIT SDK profile, battery_status: 2 good, 4 low.
    expect(stream.powerMeterReports).toEqual([
      { time: 1_717_225_200, batteryStatus: null, batteryVolts: null, cumulativeOperatingSeconds: null },
      { time: 1_717_225_260, batteryStatus: 2, batteryVolts: 3, cumulativeOperatingSeconds: 36000 },
      { time: 1_717_226_400, batteryStatus: 4, batteryVolts: 2.5, cumulativeOperatingSeconds: 37200 },
    ]);
    expect(stream.temperatureCelsius?.[0]).toBe(18);
    expect(stream.temperatureCelsius?.[1199]).toBe(19);
  });
});

describe('files that ended early', () => {
  const whole = corpus[1].bytes;

  it.each([
    ['cut at a record boundary, no final CRC', whole.subarray(0, whole.length - 2 - 200)],
    ['cut in the middle of a record', whole.subarray(0, Math.floor(whole.length / 2) + 3)],
    ['only the header', whole.subarray(0, 14)],
  ])('when the file is %s, then it is refused as ended_early with the exact reason', (_, bytes) => {
    const error = refusal(bytes);

    expect(error.code).toBe('ended_early');
    expect(error.message).toMatch(
      /^This file ended early: its header promises \d+ bytes of data but only \d+ follow, and the final checksum is missing/,
    );
  });

  it('when the header still says the file holds no data (a unit that never closed it), then it is refused as ended_early', () => {
    const bytes = whole.slice();
    new DataView(bytes.buffer).setUint32(4, 0, true);

    expect(refusal(bytes).message).toMatch(/its header still says it holds no data/);
  });

  it('when the second of two chained files is cut off, then the message says it is the second part', () => {
    const bytes = chain(whole, whole.subarray(0, whole.length - 50));

    expect(refusal(bytes).message).toMatch(/in its part 2/);
  });
});

describe('damaged files say which part is wrong', () => {
  // file_id definition (header 1 + fixed 5 + one field 3 = 9 bytes), then its data message at byte 9 of the data.
  const data = () =>
    new FitBytes()
      .define(0, MESG.fileId, [[0, BASE.enum]])
      .data(0, [FILE_TYPE.activity])
      .toFile()
      .slice(14, -2);

  it('when a record uses a message type that was never defined, then the message says so', () => {
    const broken = data();
    broken[9] = 0x05;

    expect(refusal(fitFile(broken)).message).toMatch(
      /^This file is damaged: a record at byte \d+ uses a message type the file never defined/,
    );
  });

  it('when a definition names a base type that does not exist, then the message says so', () => {
    const broken = data();
    broken[8] = 0x1f;

    expect(refusal(fitFile(broken)).message).toMatch(/a message definition at byte \d+ names an unknown kind of value/);
  });

  it('when the last message runs past the end of the data, then the message says so', () => {
    const broken = data().subarray(0, 9);
    const withHeader = new Uint8Array([...broken, 0x00]);

    expect(refusal(fitFile(withHeader)).message).toMatch(/its last message \(at byte \d+\) runs past the end of its data/);
  });

  it('when other bytes follow the end of the file, then the message counts them; zero padding is ignored', () => {
    const whole = corpus[1].bytes;

    expect(refusal(chain(whole, new Uint8Array([1, 2, 3]))).message).toMatch(/it has 3 bytes of something else after its end/);
    expect(readRideStream(chain(whole, new Uint8Array(16))).timestamps.length).toBe(readRideStream(whole).timestamps.length);
  });
});
