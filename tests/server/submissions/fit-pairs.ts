import { simulatePair } from '../../../shared/simulator/pair';

/** A 20-minute ride on a spider reading 3 % high (A) and dual pedals (B); seeded, so repeatable. */
export function cleanPair(seed = 11, options: { headUnitSerial?: number } = {}) {
  // Another head unit serial writes other files (other hashes) of the same ride.
  const device =
    options.headUnitSerial === undefined ? undefined : { productId: 1, serialNumber: options.headUnitSerial, softwareVersion: 1 };
  return simulatePair({
    seed,
    durationSeconds: 1200,
    profile: 'endurance',
    a: { position: 'total', scale: 1.03, noisePercent: 1, device },
    b: { position: 'dual', scale: 1.0, noisePercent: 1, device },
  });
}

export const asBuffer = (bytes: Uint8Array) => Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
