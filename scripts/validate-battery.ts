// Known-truth validation of the battery-life figures: simulated crowds of riders
// (rider effects, repeat batteries, batteries still running) against the truth.
// Prints, per scenario, how often the 95 % interval of the median contains the true
// median (goal: 95 %, at least 93 % given simulation error), and how often a model
// whose firmware changed nothing gets a "better" or "worse" verdict on any of its
// steps (goal: at most 5 %), and how often a halved battery life is found.
// Run: npm run validate:battery [-- --crowds N]
import { simulateBatteryCrowd, trueCrowdMedian, type BatteryCrowdOptions } from '../shared/simulator/battery-crowd';
import { batteryLife, batteryLifeByFirmware } from '../shared/statistics/battery-life';

const crowdsArg = process.argv.indexOf('--crowds');
const CROWDS = crowdsArg > 0 ? Number(process.argv[crowdsArg + 1]) : 200;
const COVERAGE_GOAL = 0.93;
const FALSE_VERDICT_GOAL = 0.05;

type Scenario = Omit<BatteryCrowdOptions, 'firmwareId'> & { name: string };
const SCENARIOS: Scenario[] = [
  { name: 'one battery each, no rider effect', riders: 20, batteriesPerRider: 1, medianHours: 400, riderSd: 0, shape: 1 },
  { name: '12 riders × 3 batteries, rider SD 0.3', riders: 12, batteriesPerRider: 3, medianHours: 400, riderSd: 0.3, shape: 1 },
  { name: '8 riders × 6 batteries, rider SD 0.5', riders: 8, batteriesPerRider: 6, medianHours: 400, riderSd: 0.5, shape: 1 },
  { name: '10 riders × 4 coin cells (shape 4), rider SD 0.2', riders: 10, batteriesPerRider: 4, medianHours: 400, riderSd: 0.2, shape: 4 },
  { name: '5 riders × 2 batteries (near the minimum)', riders: 5, batteriesPerRider: 2, medianHours: 400, riderSd: 0.3, shape: 2 },
];

const pct = (x: number) => `${(100 * x).toFixed(1)} %`;
const started = performance.now();
let allMet = true;
console.log(`Battery-life validation: ${CROWDS} simulated crowds per scenario\n`);
console.log(
  'scenario'.padEnd(52),
  'coverage'.padStart(9),
  'no median'.padStart(10),
  'false verdict'.padStart(14),
  'halving found'.padStart(14),
);
for (const scenario of SCENARIOS) {
  const truth = trueCrowdMedian({ ...scenario, firmwareId: 1 });
  let covered = 0;
  let judged = 0;
  let noMedian = 0;
  let falseVerdicts = 0;
  let halvingFound = 0;
  for (let c = 0; c < CROWDS; c++) {
    const seed = 10_000 + c * 7;
    const life = batteryLife(simulateBatteryCrowd(seed, { ...scenario, firmwareId: 1 }), seed);
    if (life.lowerHours === null && life.medianHours === null) noMedian++;
    else {
      judged++;
      if ((life.lowerHours ?? 0) <= truth && truth <= (life.upperHours ?? Number.POSITIVE_INFINITY)) covered++;
    }
    const firmware = [1, 2, 3].map((id) => ({ id, version: `1.${id}` }));
    const same = firmware.flatMap((f) => simulateBatteryCrowd(seed + f.id, { ...scenario, firmwareId: f.id }));
    if (
      batteryLifeByFirmware(same, firmware).some(
        (f) => f.againstPredecessor?.verdict === 'better' || f.againstPredecessor?.verdict === 'worse',
      )
    )
      falseVerdicts++;
    const halved = [
      ...simulateBatteryCrowd(seed + 101, { ...scenario, firmwareId: 1 }),
      ...simulateBatteryCrowd(seed + 102, { ...scenario, firmwareId: 2, medianHours: scenario.medianHours / 2 }),
    ];
    if (batteryLifeByFirmware(halved, firmware.slice(0, 2))[1]!.againstPredecessor!.verdict === 'worse') halvingFound++;
  }
  const coverage = judged > 0 ? covered / judged : 1;
  const falseRate = falseVerdicts / CROWDS;
  const met = coverage >= COVERAGE_GOAL && falseRate <= FALSE_VERDICT_GOAL;
  allMet &&= met;
  console.log(
    scenario.name.padEnd(52),
    pct(coverage).padStart(9),
    String(noMedian).padStart(10),
    pct(falseRate).padStart(14),
    pct(halvingFound / CROWDS).padStart(14),
    met ? '' : '  ← goal missed',
  );
}
console.log(
  `\nGoals: coverage of the median's 95 % interval ≥ ${pct(COVERAGE_GOAL)}; any false verdict over a model's two steps ≤ ${pct(FALSE_VERDICT_GOAL)}.`,
);
console.log(
  `Simulation error at ${CROWDS} crowds: about ±${pct(Math.sqrt((0.95 * 0.05) / CROWDS))} on a coverage of 95 %, ±${pct(Math.sqrt((0.05 * 0.95) / CROWDS))} on a rate of 5 %.`,
);
console.log(`${allMet ? 'All goals met' : 'Some goals missed'} in ${((performance.now() - started) / 1000).toFixed(1)} s.`);
process.exitCode = allMet ? 0 : 1;
