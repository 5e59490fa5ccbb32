// The valid files the fuzzer mutates, in pairs: each mutant is compared with its
// unmutated partner, as an upload would be. The simulator's files (written by the
// FIT SDK's Encoder) in a few variants, plus the demo pairs in demo/pairs.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { CompareOptions } from '@shared/analysis/types';
import { simulatePair } from '@shared/simulator/pair';

export interface SeedPair {
  name: string;
  a: Uint8Array;
  b: Uint8Array;
  options: CompareOptions;
}

const DEMO_DIRECTORY = join(import.meta.dirname, '..', '..', 'demo', 'pairs');

// What each demo pair's meters measure (scripts/make-demo-pairs.ts).
const DEMO_PAIRS: Array<[slug: string, options: CompareOptions]> = [
  ['01-clean-bias', { aPosition: 'total', bPosition: 'dual' }],
  ['02-clock-offset', { aPosition: 'total', bPosition: 'total', aAfterDrivetrain: true }],
  ['03-dropouts', { aPosition: 'left', bPosition: 'dual' }],
  ['04-change-only', { aPosition: 'total', bPosition: 'total', aAfterDrivetrain: true }],
  ['05-left-vs-dual', { aPosition: 'left', bPosition: 'dual' }],
  ['06-cadence-lag', { aPosition: 'dual', bPosition: 'total' }],
];

const SENSOR = { productId: 9, serialNumber: 515151, softwareVersion: 1.05 };

/** Short rides (12 min, just over the shortest comparison), so thousands of mutants run in seconds. */
function simulatorPairs(): SeedPair[] {
  const durationSeconds = 12 * 60;
  const withExtras = simulatePair({
    seed: 1301,
    durationSeconds,
    a: {
      position: 'dual',
      sensor: SENSOR,
      temperature: { startCelsius: 18, changePerHour: 4 },
      sensorBattery: [{ atFraction: 0.5, status: 3, volts: 2.9 }],
    },
    b: { position: 'total', powerDropoutsPerHour: 10, cadenceDropoutsPerHour: 5 },
  });
  const changeOnly = simulatePair({
    seed: 1302,
    durationSeconds,
    profile: 'intervals',
    a: { position: 'total', recordingMode: 'change-only', smoothingSeconds: 3, includeLocation: true },
    b: { position: 'left', clockOffsetSeconds: 21, cadenceLagSeconds: 1, includeLocation: true },
  });
  const indoor = simulatePair({
    seed: 1303,
    durationSeconds,
    profile: 'indoor',
    a: { position: 'total', drivetrainLossPercent: 2.1, startOffsetSeconds: 30 },
    b: { position: 'dual', endOffsetSeconds: 20 },
  });
  return [
    { name: 'simulator-extras', a: withExtras.a, b: withExtras.b, options: { aPosition: 'dual', bPosition: 'total' } },
    { name: 'simulator-change-only-gps', a: changeOnly.a, b: changeOnly.b, options: { aPosition: 'total', bPosition: 'left' } },
    { name: 'simulator-indoor', a: indoor.a, b: indoor.b, options: { aPosition: 'total', bPosition: 'dual', aAfterDrivetrain: true } },
  ];
}

function demoPairs(): SeedPair[] {
  return DEMO_PAIRS.map(([slug, options]) => ({
    name: `demo-${slug}`,
    a: new Uint8Array(readFileSync(join(DEMO_DIRECTORY, `${slug}-a.fit`))),
    b: new Uint8Array(readFileSync(join(DEMO_DIRECTORY, `${slug}-b.fit`))),
    options,
  }));
}

export function fuzzSeedPairs(): SeedPair[] {
  return [...simulatorPairs(), ...demoPairs()];
}
