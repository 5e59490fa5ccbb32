// Known-truth validation of the pooled figures: simulated crowds of riders (a rider
// effect on the bias, ride-to-ride scatter, 1–10 rides per rider, overdispersed
// dropouts) go through the server's own aggregation (contributionsOf → the scope sums
// that `stats:recompute` writes → the figures the pages show). Prints, per scenario,
// how often the 95 % intervals of the bias and the power-dropout rate contain the truth
// (goal ≥ 93 %), each with its own 95 % binomial interval, and how often a model page
// whose firmware changed nothing says "better" or "worse" on any step (goal ≤ 5 %).
// Run: npm run validate:statistics [-- --crowds N]
import { contributionsOf, type RecordingRow, type SubmissionRow } from '../server/features/statistics/contributions';
import { compareFirmwareSteps, meterFigures, type StatisticsRow } from '../server/features/statistics/figures';
import { accumulate, emptyDeltas, scopeRowsOf } from '../server/features/statistics/scope-sums';
import type { FirmwareComparison, MeterFigures } from '../shared/schemas/statistics';
import { simulateStatisticsCrowd, type SimulatedRide, type StatisticsCrowdOptions } from '../shared/simulator/statistics-crowd';
import { clopperPearsonInterval } from '../shared/statistics/binomial';

const crowdsArg = process.argv.indexOf('--crowds');
const CROWDS = crowdsArg > 0 ? Number(process.argv[crowdsArg + 1]) : 400;
const COVERAGE_GOAL = 0.93;
const FALSE_CHANGED_GOAL = 0.05;
const MODEL_ID = 1;
const PARTNER_ID = 2;
/** Firmware versions on one simulated model page: two steps, nothing changed between them. */
const FIRMWARE = [1, 2, 3];

const crowd = { biasPercent: 1.5, riderSdPercent: 1, rideSdPercent: 0.7, maxRidesPerRider: 10, dropoutsPerHour: 0.5, dropoutShape: 2 };
type Scenario = Omit<StatisticsCrowdOptions, 'firstRiderId'> & { name: string };
const SCENARIOS: Scenario[] = [
  { name: '30 rides, every ride a different rider', ...crowd, rides: 30, maxRidesPerRider: 1 },
  { name: '3 rides, 1–10 per rider', ...crowd, rides: 3 },
  { name: '10 rides, 1–10 per rider', ...crowd, rides: 10 },
  { name: '30 rides, 1–10 per rider', ...crowd, rides: 30 },
  { name: '200 rides, 1–10 per rider', ...crowd, rides: 200 },
  { name: '50 rides, rider SD 2 %, dropout shape 0.7', ...crowd, rides: 50, riderSdPercent: 2, dropoutShape: 0.7 },
  { name: '50 rides, no dropout overdispersion', ...crowd, rides: 50, dropoutShape: Number.POSITIVE_INFINITY },
  { name: '50 rides, 15 % mixed comparisons reading +6 %', ...crowd, rides: 50, mixedShare: 0.15, mixedExtraPercent: 6 },
];

function submissionOf(ride: SimulatedRide, id: number): SubmissionRow {
  return {
    id,
    rider_id: ride.riderId,
    indoor: false,
    surface: 'smooth_road',
    bias_percent: ride.biasPercent,
    sum_a: null,
    sum_b: null,
    pedalling_seconds: ride.pedallingHours * 3600,
    cadence_lag_seconds: null,
    like_for_like_mode: ride.mixed ? 'mixed' : 'direct',
    a_power_dropouts: ride.powerDropouts,
    a_cadence_dropouts: 0,
    b_power_dropouts: 0,
    b_cadence_dropouts: 0,
    agreement_block_count: null,
    agreement_mean_difference_percent: null,
    agreement_sd_percent: null,
    sprints: null,
  };
}

const recordingsOf = (firmwareId: number): RecordingRow[] => [
  {
    side: 'a',
    model_id: MODEL_ID,
    firmware_id: firmwareId,
    recording_device_id: 1,
    recording_mode: 'every_second',
    other_meters_on: false,
  },
  { side: 'b', model_id: PARTNER_ID, firmware_id: 100, recording_device_id: 1, recording_mode: 'every_second', other_meters_on: false },
];

/** The model's statistics rows per firmware, built by the server's own aggregation from the simulated rides. */
function statisticsRowsOf(ridesByFirmware: Map<number, SimulatedRide[]>): Map<number, StatisticsRow> {
  const deltas = emptyDeltas();
  let id = 0;
  for (const [firmwareId, rides] of ridesByFirmware) {
    for (const ride of rides) accumulate(deltas, contributionsOf(submissionOf(ride, ++id), recordingsOf(firmwareId)), 1);
  }
  const rows = new Map<number, StatisticsRow>();
  for (const row of scopeRowsOf(deltas).statistics)
    if (row.model_id === MODEL_ID && row.firmware_id !== null) rows.set(row.firmware_id, row);
  return rows;
}

/** A step says "changed" when its verdict is better or worse (before verdicts existed, the page highlighted any raw p below 5 %). */
const saysChanged = (comparison: FirmwareComparison) => comparison.verdict === 'better' || comparison.verdict === 'worse';

class Tally {
  hits = 0;
  trials = 0;
  add(hit: boolean): void {
    this.trials++;
    if (hit) this.hits++;
  }
  get rate(): number {
    return this.trials > 0 ? this.hits / this.trials : Number.NaN;
  }
  toString(): string {
    if (this.trials === 0) return '—';
    const { lower, upper } = clopperPearsonInterval(this.hits, this.trials);
    return `${pct(this.rate)} (${pct(lower, 0)}–${pct(upper, 0)})`;
  }
}

const pct = (x: number, digits = 1) => `${(100 * x).toFixed(digits)} %`;
const started = performance.now();
let allMet = true;
console.log(`Pooled-statistics validation: ${CROWDS} simulated model pages per scenario (3 firmware versions, nothing changed)\n`);
console.log(
  'scenario'.padEnd(48),
  'bias coverage'.padStart(22),
  'dropout coverage'.padStart(22),
  'false changed'.padStart(22),
  'shown'.padStart(6),
);
for (const scenario of SCENARIOS) {
  const bias = new Tally();
  const dropouts = new Tally();
  const falseChanged = new Tally();
  for (let c = 0; c < CROWDS; c++) {
    const ridesByFirmware = new Map(
      FIRMWARE.map((firmwareId) => [
        firmwareId,
        simulateStatisticsCrowd(1_000 + c * 31 + firmwareId, { ...scenario, firstRiderId: firmwareId * 100_000 }),
      ]),
    );
    const rows = statisticsRowsOf(ridesByFirmware);
    const versions = FIRMWARE.map((firmwareId) => ({
      version: `1.${firmwareId}`,
      row: rows.get(firmwareId),
      figures: meterFigures(rows.get(firmwareId)),
    }));
    const first: MeterFigures = versions[0]!.figures;
    if (first.bias) bias.add(first.bias.lowerPercent <= scenario.biasPercent && scenario.biasPercent <= first.bias.upperPercent);
    if (first.powerDropouts)
      dropouts.add(first.powerDropouts.lower <= scenario.dropoutsPerHour && scenario.dropoutsPerHour <= first.powerDropouts.upper);
    falseChanged.add(compareFirmwareSteps(versions).some(saysChanged));
  }
  const met =
    (bias.trials === 0 || bias.rate >= COVERAGE_GOAL) &&
    (dropouts.trials === 0 || dropouts.rate >= COVERAGE_GOAL) &&
    falseChanged.rate <= FALSE_CHANGED_GOAL;
  allMet &&= met;
  console.log(
    scenario.name.padEnd(48),
    String(bias).padStart(22),
    String(dropouts).padStart(22),
    String(falseChanged).padStart(22),
    pct(bias.trials / CROWDS, 0).padStart(6),
    met ? '' : ' ← goal missed',
  );
}
console.log(`\nTruth: bias ${crowd.biasPercent} %, ${crowd.dropoutsPerHour} power dropouts per hour (mean over riders' units).`);
console.log(
  `Goals: each 95 % interval covers the truth ≥ ${pct(COVERAGE_GOAL)}; any "better"/"worse" on a page of two no-change steps ≤ ${pct(FALSE_CHANGED_GOAL)}.`,
);
console.log(
  'In brackets: the 95 % Clopper–Pearson interval of the simulated rate; "shown": share of pages whose first firmware had a bias figure.',
);
console.log(`${allMet ? 'All goals met' : 'Some goals missed'} in ${((performance.now() - started) / 1000).toFixed(1)} s.`);
process.exitCode = allMet ? 0 : 1;
