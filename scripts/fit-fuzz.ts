// npm run fuzz:fit -- --count N --seed S [--keep-dir D] [--threads T] [--no-sdk]:
// mutates valid FIT files and runs each mutant as an upload and its analysis would
// (scripts/lib/fit-fuzz-campaign.ts); prints the outcomes, keeps every crashing,
// hanging or out-of-memory input, and exits non-zero when there is one.
import { parseArgs } from 'node:util';
import { failureCount, formatFuzzSummary, runFitFuzz } from './lib/fit-fuzz-campaign';

const { values } = parseArgs({
  options: {
    count: { type: 'string', default: '2000' },
    seed: { type: 'string', default: '1' },
    'keep-dir': { type: 'string', default: 'test-output/fuzz-fit' },
    threads: { type: 'string' },
    'time-limit-ms': { type: 'string', default: '10000' },
    'no-sdk': { type: 'boolean', default: false },
  },
});

const count = Number(values.count);
const seed = Number(values.seed);
if (!Number.isInteger(count) || count < 1 || !Number.isInteger(seed)) {
  console.error('Usage: npm run fuzz:fit -- --count N --seed S [--keep-dir D] [--threads T] [--time-limit-ms MS] [--no-sdk]');
  process.exit(2);
}

let reported = 0;
const summary = await runFitFuzz({
  count,
  seed,
  keepDir: values['keep-dir'],
  threads: values.threads ? Number(values.threads) : undefined,
  timeLimitMs: Number(values['time-limit-ms']),
  reference: !values['no-sdk'],
  onProgress: (done) => {
    if (Math.floor(done / 1000) <= reported) return;
    reported = Math.floor(done / 1000);
    process.stderr.write(`  ${reported * 1000}/${count} mutants\n`);
  },
});
console.log(formatFuzzSummary(summary, { seed, keepDir: values['keep-dir'] }));
process.exitCode = failureCount(summary) > 0 ? 1 : 0;
