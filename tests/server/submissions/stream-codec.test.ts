import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { decodeFit } from '@shared/analysis/decode-fit';
import { simulatePair } from '@shared/simulator/pair';
import { decodeStream, encodeStream } from '../../../server/features/submissions/stream-codec';

describe('stored streams', () => {
  it('when a recording with temperature and battery reports is stored, then both come back with the streams', () => {
    const { a } = simulatePair({
      seed: 21,
      durationSeconds: 1200,
      a: {
        position: 'total',
        temperature: { startCelsius: 4, changePerHour: 6 },
        sensor: { productId: 2, serialNumber: 77, softwareVersion: 1.1 },
        sensorBattery: [{ atFraction: 0.5, status: 3, volts: 2.8 }],
      },
      b: { position: 'total' },
    });
    const stream = decodeFit(a);

    const stored = decodeStream(encodeStream(stream));

    expect(Array.from(stored.temperatureCelsius!)).toEqual(Array.from(stream.temperatureCelsius!));
    expect(stored.powerMeterReports).toEqual(stream.powerMeterReports);
    expect(stored.powerMeterReports!.some((r) => r.batteryStatus === 3)).toBe(true);
    expect(Array.from(stored.powerWatts)).toEqual(Array.from(stream.powerWatts));
  });

  it('when a stream stored before temperature was kept (layout 1) is read, then it decodes without temperature', () => {
    const header = Buffer.from(
      JSON.stringify({ v: 1, count: 2, device: { creator: {}, powerMeter: null }, recording: { recordCount: 2 } }),
    );
    const body = Buffer.alloc(4 + header.length + 2 * (8 + 12));
    body.writeUInt32LE(header.length, 0);
    header.copy(body, 4);
    let offset = 4 + header.length;
    for (const t of [100, 101]) offset = body.writeDoubleLE(t, offset);
    for (const v of [200, 210, 90, 91, 50, 51]) offset = body.writeFloatLE(v, offset);

    const stored = decodeStream(gzipSync(body));

    expect(Array.from(stored.timestamps)).toEqual([100, 101]);
    expect(Array.from(stored.powerWatts)).toEqual([200, 210]);
    expect(Array.from(stored.rightBalancePercent)).toEqual([50, 51]);
    expect(stored.temperatureCelsius).toBeUndefined();
    expect(stored.powerMeterReports).toEqual([]);
  });
});
