// Writes the ready-made demo pairs in demo/pairs/ (two small FIT files per ride and
// a README with each pair's injected truth), so a newcomer can try the upload form
// at once. Deterministic: running it again rewrites the same bytes.
//   npx tsx scripts/make-demo-pairs.ts
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { DRIVETRAIN_LOSS_PERCENT } from '@shared/simulator/meter';
import { simulatePair, type PairOptions, type PairTruth } from '@shared/simulator/pair';

const OUTPUT_DIRECTORY = join(import.meta.dirname, '..', 'demo', 'pairs');

interface DemoPair {
  slug: string;
  title: string;
  story: string;
  options: PairOptions;
}

// Made-up devices; FIT manufacturer 255 (development) throughout.
const HEAD_UNIT = { productId: 101, serialNumber: 510_001, softwareVersion: 4.1, productName: 'Demo head unit' };
const SECOND_HEAD_UNIT = { productId: 102, serialNumber: 510_002, softwareVersion: 2.3, productName: 'Demo head unit mini' };
const PHONE_APP = { productId: 103, serialNumber: 510_003, softwareVersion: 7.0, productName: 'Demo phone app' };
const meter = (productId: number, productName: string) => ({
  productId,
  serialNumber: 620_000 + productId,
  softwareVersion: 1.2,
  productName,
});
const SPIDER = meter(201, 'Demo spider meter');
const PEDALS = meter(202, 'Demo dual pedals');
const LEFT_CRANK = meter(203, 'Demo left crank');
const HUB = meter(204, 'Demo rear hub');
const TRAINER = meter(205, 'Demo smart trainer');

const START = Date.UTC(2024, 4, 18, 6, 30) / 1000;

const PAIRS: DemoPair[] = [
  {
    slug: '01-clean-bias',
    title: 'A clean ride with a small bias',
    story:
      'A spider meter reading 2.5 % high against dual pedals; same head unit settings, no dropouts. The files carry a made-up GPS track in the open sea, which the decoder must drop.',
    options: {
      seed: 1001,
      durationSeconds: 30 * 60,
      startTime: START,
      profile: 'endurance',
      a: { position: 'total', scale: 1.025, device: HEAD_UNIT, sensor: SPIDER, includeLocation: true },
      b: { position: 'dual', device: SECOND_HEAD_UNIT, sensor: PEDALS, includeLocation: true },
    },
  },
  {
    slug: '02-clock-offset',
    title: 'Clocks apart, started and stopped at different times',
    story:
      "The hub's head unit runs 38 s ahead, starts 90 s after the spider's and stops 60 s before it. The hub measures after the chain, so it reads about 2 % low.",
    options: {
      seed: 1002,
      durationSeconds: 30 * 60,
      startTime: START + 86_400,
      profile: 'intervals',
      a: {
        position: 'total',
        drivetrainLossPercent: DRIVETRAIN_LOSS_PERCENT,
        clockOffsetSeconds: 38,
        startOffsetSeconds: 90,
        endOffsetSeconds: 60,
        device: SECOND_HEAD_UNIT,
        sensor: HUB,
      },
      b: { position: 'total', device: HEAD_UNIT, sensor: SPIDER },
    },
  },
  {
    slug: '03-dropouts',
    title: 'Dropouts on both sides',
    story: 'A left crank with frequent power and cadence dropouts against dual pedals with an occasional one.',
    options: {
      seed: 1003,
      durationSeconds: 40 * 60,
      startTime: START + 2 * 86_400,
      profile: 'race',
      balanceRightPercent: 51,
      a: { position: 'left', powerDropoutsPerHour: 6, cadenceDropoutsPerHour: 4, device: HEAD_UNIT, sensor: LEFT_CRANK },
      b: { position: 'dual', powerDropoutsPerHour: 2, device: SECOND_HEAD_UNIT, sensor: PEDALS },
    },
  },
  {
    slug: '04-change-only',
    title: 'Indoor ride recorded change-only',
    story:
      "A smart trainer's app records only when values change (gaps of up to 4 s that are not dropouts) and smooths power over 3 s; the spider is recorded every second.",
    options: {
      seed: 1004,
      durationSeconds: 25 * 60,
      startTime: START + 3 * 86_400,
      profile: 'indoor',
      a: {
        position: 'total',
        drivetrainLossPercent: DRIVETRAIN_LOSS_PERCENT,
        recordingMode: 'change-only',
        smoothingSeconds: 3,
        device: PHONE_APP,
        sensor: TRAINER,
      },
      b: { position: 'total', device: HEAD_UNIT, sensor: SPIDER },
    },
  },
  {
    slug: '05-left-vs-dual',
    title: 'A left-only meter against dual pedals with balance',
    story:
      'The rider pushes 53 % with the right leg, so the left crank (1 % high on its own leg) doubles a weaker leg: the naive total comparison shows about −5 %, the like-for-like comparison via balance about +1 %.',
    options: {
      seed: 1005,
      durationSeconds: 30 * 60,
      startTime: START + 4 * 86_400,
      profile: 'endurance',
      balanceRightPercent: 53,
      a: { position: 'left', scale: 1.01, device: HEAD_UNIT, sensor: LEFT_CRANK },
      b: { position: 'dual', device: SECOND_HEAD_UNIT, sensor: PEDALS },
    },
  },
  {
    slug: '06-cadence-lag',
    title: 'Cadence that trails',
    story: "The pedals' cadence trails the spider's by 2 s; power agrees.",
    options: {
      seed: 1006,
      durationSeconds: 20 * 60,
      startTime: START + 5 * 86_400,
      profile: 'indoor',
      a: { position: 'dual', cadenceLagSeconds: 2, device: HEAD_UNIT, sensor: PEDALS },
      b: { position: 'total', device: SECOND_HEAD_UNIT, sensor: SPIDER },
    },
  },
];

function truthTable(truth: PairTruth): string {
  const signed = (value: number, digits = 1) => `${value >= 0 ? '+' : '−'}${Math.abs(value).toFixed(digits)}`;
  const rows = [
    ['bias, A vs B (ΣA/ΣB − 1, as recorded)', `${signed(truth.biasPercent)} %`],
    ['bias like for like (meter error only)', `${signed(truth.instrumentBiasPercent)} %`],
    ['clock offset (A ahead of B)', `${signed(truth.clockOffsetSeconds, 0)} s`],
    ['cadence lag (A trailing B)', `${signed(truth.cadenceLagSeconds, 0)} s`],
    ['power dropouts A / B', `${truth.dropouts.a.power} / ${truth.dropouts.b.power}`],
    ['cadence dropouts A / B', `${truth.dropouts.a.cadence} / ${truth.dropouts.b.cadence}`],
    ['overlap', `${truth.overlapSeconds} s`],
  ];
  if (truth.apparent.clockOffsetSeconds !== truth.clockOffsetSeconds) {
    // A trailing power average delays the power it records; alignment by power sees the sum.
    rows.push([
      'clock offset and cadence lag as alignment by power sees them (smoothing delay included)',
      `${signed(truth.apparent.clockOffsetSeconds, 1)} s, ${signed(truth.apparent.cadenceLagSeconds, 1)} s`,
    ]);
  }
  return ['| injected | value |', '| --- | --- |', ...rows.map(([name, value]) => `| ${name} | ${value} |`)].join('\n');
}

mkdirSync(OUTPUT_DIRECTORY, { recursive: true });
const sections: string[] = [];
for (const pair of PAIRS) {
  const started = performance.now();
  const { a, b, truth } = simulatePair(pair.options);
  writeFileSync(join(OUTPUT_DIRECTORY, `${pair.slug}-a.fit`), a);
  writeFileSync(join(OUTPUT_DIRECTORY, `${pair.slug}-b.fit`), b);
  const positions = `A: ${pair.options.a.sensor?.productName} (${pair.options.a.position}); B: ${pair.options.b.sensor?.productName} (${pair.options.b.position})`;
  sections.push(
    [
      `## ${pair.slug}: ${pair.title}`,
      '',
      `\`${pair.slug}-a.fit\` and \`${pair.slug}-b.fit\`, ${pair.options.durationSeconds / 60} min, ${pair.options.profile} ride. ${positions}.`,
      '',
      pair.story,
      '',
      truthTable(truth),
    ].join('\n'),
  );
  console.log(`${pair.slug}: ${a.length + b.length} bytes in ${(performance.now() - started).toFixed(0)} ms`);
}

const readme = `# Demo pairs

Ready-made paired recordings (two FIT files of one simulated ride) to try the upload form or the command line:

\`\`\`sh
npm run compare -- demo/pairs/01-clean-bias-a.fit demo/pairs/01-clean-bias-b.fit --a-position total --b-position dual
\`\`\`

Every ride, rider and device here is made up: the files come from Crosswatt's seeded simulator (\`shared/simulator/\`)
and name FIT manufacturer 255 (development). File A is the device being judged, B its partner. Regenerate them with
\`npx tsx scripts/make-demo-pairs.ts\` (same bytes every time).

The tables give the truth injected into each pair. The bias "as recorded" is the noise-free expectation of ΣA/ΣB − 1
over the seconds both meters report; single-sided meters double their own leg, so it includes the rider's leg balance.
"Like for like" is the meters' own error, what a comparison via balance (or between two total meters) should find.
Dropouts are counted where the partner reads at least 50 W (power) or 30 rpm (cadence).

${sections.join('\n\n')}
`;
writeFileSync(join(OUTPUT_DIRECTORY, 'README.md'), readme);
console.log(`wrote ${PAIRS.length} pairs to ${OUTPUT_DIRECTORY}`);
