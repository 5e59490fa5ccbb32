import { Decoder, Stream } from '@garmin/fitsdk';
import { describe, expect, it } from 'vitest';
import { decodeFit, FIT_EPOCH_UNIX_SECONDS, verifyFitFile } from '@shared/analysis/decode-fit';
import { AnalysisError } from '@shared/analysis/errors';
import { simulatePair } from '@shared/simulator/pair';
import { recordingFit, TEST_HEAD_UNIT, TEST_POWER_SENSOR } from './fit-files';

// The FIT SDK's own test data, "fitFileShort": one file_id message. Header CRC 0xA38E
// (bytes 12–13), file CRC 0xF25D (last two bytes, little-endian).
const FIT_SDK_SHORT_FILE = Uint8Array.from([
  0x0e, 0x20, 0x8b, 0x08, 0x24, 0x00, 0x00, 0x00, 0x2e, 0x46, 0x49, 0x54, 0x8e, 0xa3, 0x40, 0x00, 0x00, 0x00, 0x00, 0x04, 0x00, 0x01, 0x00,
  0x01, 0x02, 0x84, 0x04, 0x04, 0x86, 0x08, 0x0a, 0x07, 0x00, 0x04, 0x01, 0x00, 0x00, 0xca, 0x9a, 0x3b, 0x61, 0x62, 0x63, 0x64, 0x65, 0x66,
  0x67, 0x68, 0x69, 0x00, 0x5d, 0xf2,
]);

interface ReferenceRecord {
  timestamp: number;
  power?: number;
  cadence?: number;
  leftRightBalance?: number;
  positionLat?: number;
}

function referenceRecords(bytes: Uint8Array): ReferenceRecord[] {
  const decoder = new Decoder(Stream.fromByteArray(Array.from(bytes)));
  const { messages, errors } = decoder.read({ convertDateTimesToDates: false, expandComponents: false, mergeHeartRates: false });
  expect(errors).toEqual([]);
  return (messages.recordMesgs ?? []) as ReferenceRecord[];
}

function decodeError(bytes: Uint8Array): AnalysisError {
  try {
    decodeFit(bytes);
  } catch (error) {
    if (error instanceof AnalysisError) return error;
    throw error;
  }
  throw new Error('expected decodeFit to fail');
}

describe('decodeFit against the FIT SDK reference decoder', () => {
  const pair = simulatePair({
    seed: 31,
    durationSeconds: 1800,
    a: { position: 'total', recordingMode: 'change-only', powerDropoutsPerHour: 4, includeLocation: true },
    b: { position: 'dual', clockOffsetSeconds: 12 },
  });

  for (const side of ['a', 'b'] as const) {
    it(`when file ${side.toUpperCase()} is decoded, then timestamps, power and cadence equal the reference decoder's`, () => {
      const reference = referenceRecords(pair[side]);

      const stream = decodeFit(pair[side]);

      expect(stream.timestamps.length).toBe(reference.length);
      // FIT SDK profile, date_time: Unix seconds = FIT seconds + 631065600.
      expect(Array.from(stream.timestamps)).toEqual(reference.map((record) => record.timestamp + 631065600));
      expect(Array.from(stream.powerWatts)).toEqual(reference.map((record) => record.power ?? NaN));
      expect(Array.from(stream.cadenceRpm)).toEqual(reference.map((record) => record.cadence ?? NaN));
    });
  }

  it("when a dual meter's balance bytes are decoded, then they are the low 7 bits of the reference's bytes with the right-leg bit set", () => {
    const reference = referenceRecords(pair.b);

    const stream = decodeFit(pair.b);

    const expected = reference.map((record) =>
      record.leftRightBalance !== undefined && record.leftRightBalance & 0x80 ? record.leftRightBalance & 0x7f : NaN,
    );
    expect(Array.from(stream.rightBalancePercent)).toEqual(expected);
    expect(expected.some((value) => value > 0)).toBe(true);
  });

  it('when the FIT epoch is converted, then it is 1989-12-31T00:00:00Z', () => {
    // FIT SDK profile: date_time counts seconds since UTC 00:00 Dec 31 1989.
    expect(FIT_EPOCH_UNIX_SECONDS).toBe(Date.UTC(1989, 11, 31) / 1000);
    expect(FIT_EPOCH_UNIX_SECONDS).toBe(631065600);
  });
});

describe('decodeFit privacy and device info', () => {
  it('when the file carries a GPS track, then no location leaves the decoder', () => {
    const { a } = simulatePair({
      seed: 5,
      durationSeconds: 900,
      a: { position: 'total', includeLocation: true },
      b: { position: 'total' },
    });
    const withTrack = referenceRecords(a).filter((record) => record.positionLat !== undefined);
    expect(withTrack.length).toBeGreaterThan(0);

    const stream = decodeFit(a);

    expect(Object.keys(stream).sort()).toEqual([
      'cadenceRpm',
      'device',
      'powerMeterReports',
      'powerWatts',
      'recording',
      'rightBalancePercent',
      'timestamps',
    ]);
    expect(JSON.stringify({ ...stream, timestamps: [], powerWatts: [], cadenceRpm: [], rightBalancePercent: [] })).not.toMatch(
      /position|latitude|longitude|"lat"|"long"/i,
    );
  });

  it('when the file names its head unit and power sensor, then both identities are decoded', () => {
    const stream = decodeFit(recordingFit({ seconds: 700 }));

    expect(stream.device.creator).toEqual({
      manufacturerId: 255,
      productId: TEST_HEAD_UNIT.productId,
      serialNumber: TEST_HEAD_UNIT.serialNumber,
      softwareVersion: TEST_HEAD_UNIT.softwareVersion,
    });
    expect(stream.device.powerMeter).toEqual({
      manufacturerId: 255,
      productId: TEST_POWER_SENSOR.productId,
      serialNumber: TEST_POWER_SENSOR.serialNumber,
      softwareVersion: TEST_POWER_SENSOR.softwareVersion,
    });
  });

  it('when balance bytes lack the right-leg bit or are invalid, then the balance is unknown', () => {
    // ANT+ Bicycle Power profile, page 0x10: bit 7 clear = side unknown; 0xFF = invalid.
    const bytes = recordingFit({ seconds: 700, balance: (i) => [0x80 | 53, 53, 0xff][i % 3] });

    const stream = decodeFit(bytes);

    expect(stream.rightBalancePercent[0]).toBe(53);
    expect(stream.rightBalancePercent[1]).toBeNaN();
    expect(stream.rightBalancePercent[2]).toBeNaN();
  });

  it('when a head unit records only on change, then the statistics show its median interval and no long gaps', () => {
    const { a } = simulatePair({
      seed: 8,
      durationSeconds: 1800,
      a: { position: 'total', recordingMode: 'change-only' },
      b: { position: 'total' },
    });

    const { recording } = decodeFit(a);

    expect(recording.medianIntervalSeconds).toBeGreaterThanOrEqual(1);
    expect(recording.longGapCount).toBe(0);
    expect(recording.recordCount).toBeLessThan(1800);
  });
});

describe('decodeFit verification errors', () => {
  it("when the FIT SDK's short test file is verified, then its header and file CRCs are accepted", () => {
    expect(verifyFitFile(FIT_SDK_SHORT_FILE)).toBe(FIT_SDK_SHORT_FILE.length);
  });

  it('when the file is a text file, then the error is not_fit', () => {
    const error = decodeError(new TextEncoder().encode('date,power\n2024-06-01,200\n'));

    expect(error.code).toBe('not_fit');
    expect(error.message).toMatch(/not a FIT/);
  });

  it('when the file is cut short, then the error is ended_early', () => {
    const bytes = recordingFit({ seconds: 700 });

    expect(decodeError(bytes.subarray(0, bytes.length - 100)).code).toBe('ended_early');
  });

  it('when one byte of the data is changed, then the CRC mismatch is damaged_file', () => {
    const bytes = recordingFit({ seconds: 700 }).slice();
    bytes[Math.floor(bytes.length / 2)] ^= 0x01;

    const error = decodeError(bytes);

    expect(error.code).toBe('damaged_file');
    expect(error.message).toMatch(/checksum/);
  });

  it('when the header CRC is wrong, then the error is damaged_file', () => {
    const bytes = FIT_SDK_SHORT_FILE.slice();
    bytes[12] ^= 0xff;

    expect(() => verifyFitFile(bytes)).toThrow(AnalysisError);
  });

  it('when no record carries power, then the error is no_power', () => {
    // 0xFFFF is uint16's invalid value: the field is present but says "no reading".
    expect(decodeError(recordingFit({ seconds: 700, power: () => 0xffff })).code).toBe('no_power');
    expect(decodeError(FIT_SDK_SHORT_FILE).code).toBe('no_power');
  });

  it('when the recording lasts 5 minutes, then the error is too_short', () => {
    expect(decodeError(recordingFit({ seconds: 300 })).code).toBe('too_short');
  });
});
