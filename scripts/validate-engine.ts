// npm run validate:engine [-- --pairs N]: the recovery sweep of issue 14 (fixed
// seeds), printing each estimate's error distribution and the false-event rates,
// split by partner smoothing and recording mode, against the goals.
import { MAX_CLOCK_OFFSET_SECONDS } from '@shared/analysis/method';
import {
  distribution,
  PARTNER_SMOOTHING_SECONDS,
  RECORDING_MODES,
  runSweepCase,
  sweepCase,
  type Distribution,
  type SweepOutcome,
} from './lib/engine-sweep';

const BIAS_GOAL_PP = 0.3;
const GOAL_SHARE = 0.99;

const pairsArg = process.argv.indexOf('--pairs');
const PAIRS = pairsArg > 0 ? Number(process.argv[pairsArg + 1]) : 400;

const started = performance.now();
const outcomes: SweepOutcome[] = [];
for (let i = 0; i < PAIRS; i++) {
  outcomes.push(runSweepCase(sweepCase(i)));
  if ((i + 1) % 50 === 0) process.stderr.write(`  ${i + 1}/${PAIRS} pairs\n`);
}
const seconds = (performance.now() - started) / 1000;

const fmt = (v: number, digits = 3) => (v >= 0 ? ' ' : '') + v.toFixed(digits);
const line = (label: string, d: Distribution | null, digits = 3) =>
  d === null
    ? `${label.padEnd(34)} (none)`
    : `${label.padEnd(34)} n=${String(d.n).padStart(3)}  mean ${fmt(d.mean, digits)}  SD ${fmt(d.sd, digits)}  p1 ${fmt(d.p1, digits)}  p99 ${fmt(d.p99, digits)}  worst ${fmt(d.worst, digits)}`;
const pct = (x: number, n: number) => (n === 0 ? '   –  ' : `${((100 * x) / n).toFixed(1).padStart(5)} %`);

const analysed = outcomes.filter((o) => o.result !== null);
const inWindow = analysed.filter((o) => !o.case.outOfWindow);
const clean = inWindow.filter((o) => Object.values(o.case.dropouts).every((n) => n === 0));
const failed = outcomes.filter((o) => o.result === null);
const numbers = (values: (number | null | undefined)[]) => values.filter((v): v is number => typeof v === 'number');

console.log(
  `Engine recovery sweep: ${PAIRS} pairs, seeds ${outcomes[0]?.case.seed}…${outcomes.at(-1)?.case.seed}, ${seconds.toFixed(0)} s`,
);
console.log(
  `refused by the engine: ${failed.length}${
    failed.length
      ? ` — ${failed
          .slice(0, 5)
          .map((o) => `#${o.case.index}: ${o.error}`)
          .join('; ')}`
      : ''
  }`,
);
console.log('');
console.log('Error distributions (estimate − truth), in-window pairs');
console.log(line('bias (pp)', distribution(numbers(inWindow.map((o) => o.biasError)))));
console.log(line('clock offset (s)', distribution(numbers(inWindow.map((o) => o.offsetError))), 1));
console.log(line('cadence lag (s)', distribution(numbers(inWindow.map((o) => o.cadenceLagError))), 1));
const withDropouts = inWindow.filter((o) => !clean.includes(o));
for (const key of ['aPower', 'aCadence', 'bPower', 'bCadence'] as const) {
  console.log(
    line(`dropout count ${key} (pairs with injected)`, distribution(numbers(withDropouts.map((o) => o.dropoutErrors?.[key]))), 2),
  );
}
console.log('');

interface Row {
  label: string;
  pairs: SweepOutcome[];
}
const rows: Row[] = [];
for (const smoothing of PARTNER_SMOOTHING_SECONDS) {
  for (const mode of RECORDING_MODES) {
    rows.push({
      label: `B smoothed ${String(smoothing).padStart(2)} s, ${mode.padEnd(12)}`,
      pairs: inWindow.filter((o) => o.case.partnerSmoothingSeconds === smoothing && o.case.recordingMode === mode),
    });
  }
}
rows.push({ label: 'all'.padEnd(35), pairs: inWindow });
console.log('Split by partner smoothing and recording mode (in-window pairs)');
console.log(
  `${''.padEnd(35)}  pairs  bias ±${BIAS_GOAL_PP}pp  bias p1/p99 (pp)   offset exact  clean pairs  false power  false cadence  lag exact`,
);
for (const row of rows) {
  const p = row.pairs;
  const b = distribution(numbers(p.map((o) => o.biasError)));
  const within = p.filter((o) => o.biasError !== null && Math.abs(o.biasError) <= BIAS_GOAL_PP).length;
  const exact = p.filter((o) => o.offsetError === 0).length;
  const c = p.filter((o) => clean.includes(o));
  const falsePower = c.filter((o) => o.result!.dropouts.a.power.count + o.result!.dropouts.b.power.count > 0).length;
  const falseCadence = c.filter((o) => o.result!.dropouts.a.cadence.count + o.result!.dropouts.b.cadence.count > 0).length;
  const lagExact = p.filter((o) => o.cadenceLagError === 0).length;
  console.log(
    `${row.label}  ${String(p.length).padStart(5)}  ${pct(within, p.length).padStart(10)}  ${b ? `${fmt(b.p1, 2)} / ${fmt(b.p99, 2)}`.padStart(16) : ''.padStart(16)}  ${pct(exact, p.length).padStart(12)}  ${String(c.length).padStart(11)}  ${pct(falsePower, c.length).padStart(11)}  ${pct(falseCadence, c.length).padStart(13)}  ${pct(lagExact, p.length).padStart(9)}`,
  );
}
console.log('');

const outOfWindow = analysed.filter((o) => o.case.outOfWindow);
const outFlagged = outOfWindow.filter((o) => o.boundFlagged).length;
const inFlagged = inWindow.filter((o) => o.boundFlagged).length;
console.log(
  `Out-of-window pairs (|offset| > ${MAX_CLOCK_OFFSET_SECONDS} s): ${outOfWindow.length}, flagged on a search bound: ${outFlagged}; in-window pairs flagged: ${inFlagged}`,
);
console.log('');
// No sweep pair drifts, so every drift flag is a false one.
const driftFlagged = inWindow.filter((o) => o.result!.flags.some((flag) => flag.code === 'difference_drift')).length;
console.log(`In-window pairs flagged for an in-ride drift (none drifts): ${driftFlagged} (${pct(driftFlagged, inWindow.length).trim()})`);
console.log('');

const cleanFalse = clean.filter((o) =>
  Object.values(o.result!.dropouts).some((side) => typeof side === 'object' && (side.power.count > 0 || side.cadence.count > 0)),
).length;
const goals = [
  {
    name: `no false power or cadence dropout in ≥ 99 % of pairs without injected dropouts`,
    met: clean.length > 0 && (clean.length - cleanFalse) / clean.length >= GOAL_SHARE,
    figure: pct(clean.length - cleanFalse, clean.length),
  },
  ...rows.slice(0, -1).map((row) => {
    const within = row.pairs.filter((o) => o.biasError !== null && Math.abs(o.biasError) <= BIAS_GOAL_PP).length;
    return {
      name: `bias within ±${BIAS_GOAL_PP} pp in ≥ 99 %: ${row.label.trim()}`,
      met: row.pairs.length > 0 && within / row.pairs.length >= GOAL_SHARE,
      figure: pct(within, row.pairs.length),
    };
  }),
  {
    name: 'offset exact in ≥ 99 % of in-window pairs',
    met: inWindow.filter((o) => o.offsetError === 0).length / inWindow.length >= GOAL_SHARE,
    figure: pct(inWindow.filter((o) => o.offsetError === 0).length, inWindow.length),
  },
  { name: 'every out-of-window pair flagged', met: outFlagged === outOfWindow.length, figure: `${outFlagged}/${outOfWindow.length}` },
  { name: 'no pair refused', met: failed.length === 0, figure: String(failed.length) },
  {
    name: 'false in-ride drift flags in ≤ 1 % of in-window pairs',
    met: driftFlagged / inWindow.length <= 0.01,
    figure: pct(driftFlagged, inWindow.length),
  },
];
console.log('Goals');
for (const goal of goals) console.log(`  ${goal.met ? 'met    ' : 'NOT MET'}  ${goal.name}: ${goal.figure.trim()}`);
process.exitCode = goals.every((goal) => goal.met) ? 0 : 1;
