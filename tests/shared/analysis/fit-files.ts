// FIT bytes for decoder tests, written by the simulator's FIT writer (the FIT SDK's
// reference encoder underneath), so no binary fixtures need to live in the repo.
import { encodeActivityFit } from '@shared/simulator/fit-writer';
import type { MeterRecording } from '@shared/simulator/meter';

export const TEST_HEAD_UNIT = { productId: 7, serialNumber: 424242, softwareVersion: 3.2, productName: 'Testbench head unit' };
export const TEST_POWER_SENSOR = { productId: 9, serialNumber: 515151, softwareVersion: 1.05 };

/** A plain recording: one record a second with the given power, cadence and balance bytes. */
export function recordingFit(options: {
  seconds: number;
  power?: (i: number) => number;
  balance?: (i: number) => number;
  start?: number;
}): Uint8Array {
  const start = options.start ?? 1_717_225_200;
  const recording: MeterRecording = {
    position: 'dual',
    timestamps: Float64Array.from({ length: options.seconds }, (_, i) => start + i),
    power: Uint16Array.from({ length: options.seconds }, (_, i) => options.power?.(i) ?? 200 + (i % 50)),
    cadence: Uint8Array.from({ length: options.seconds }, () => 90),
    balance: options.balance ? Uint8Array.from({ length: options.seconds }, (_, i) => options.balance!(i)) : undefined,
    events: [],
  };
  return encodeActivityFit(recording, TEST_HEAD_UNIT, { sensor: TEST_POWER_SENSOR });
}
