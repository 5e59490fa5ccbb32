// Times FIT decoding and the comparison of a 4-hour pair separately (issue 3,
// Performance): the goal is an analysis faster than decoding one of the two files.
import { compareRecordings } from '@shared/analysis/compare-recordings';
import { decodeFit } from '@shared/analysis/decode-fit';
import { simulatePair } from '@shared/simulator/pair';

const DURATION_SECONDS = 4 * 3600;
const WARM_UP_RUNS = 3;
const TIMED_RUNS = 15;
const OPTIONS = { aPosition: 'left', bPosition: 'dual' } as const;

function median(values: number[]): number {
  const sorted = [...values].sort((x, y) => x - y);
  return sorted[Math.floor(sorted.length / 2)];
}

function time(work: () => unknown): number[] {
  for (let i = 0; i < WARM_UP_RUNS; i++) work();
  const times: number[] = [];
  for (let i = 0; i < TIMED_RUNS; i++) {
    const start = performance.now();
    work();
    times.push(performance.now() - start);
  }
  return times;
}

const pair = simulatePair({
  seed: 2024,
  durationSeconds: DURATION_SECONDS,
  profile: 'race',
  a: { position: 'left', scale: 1.02, clockOffsetSeconds: 37, cadenceLagSeconds: 2, powerDropoutsPerHour: 2, smoothingSeconds: 3 },
  b: { position: 'dual', powerDropoutsPerHour: 1, cadenceDropoutsPerHour: 1, recordingMode: 'change-only', startOffsetSeconds: 120 },
});
const a = decodeFit(pair.a);
const b = decodeFit(pair.b);

// Peak resident memory only grows, so reading it after each phase shows whether the analysis raised it.
const peakMegabytes = () => process.resourceUsage().maxRSS / 1024;
const decodeTimes = time(() => decodeFit(pair.a));
const peakAfterDecoding = peakMegabytes();
const analysisTimes = time(() => compareRecordings(a, b, OPTIONS));
const peakAfterAnalysis = peakMegabytes();
const result = compareRecordings(a, b, OPTIONS);

const decodeMs = median(decodeTimes);
const analysisMs = median(analysisTimes);
console.log(
  `4-hour pair: ${a.timestamps.length} + ${b.timestamps.length} records, FIT files of ${pair.a.length} and ${pair.b.length} bytes`,
);
console.log(
  `decode one file:  median ${decodeMs.toFixed(1)} ms (min ${Math.min(...decodeTimes).toFixed(1)}, max ${Math.max(...decodeTimes).toFixed(1)}, ${TIMED_RUNS} runs)`,
);
console.log(
  `analyse the pair: median ${analysisMs.toFixed(1)} ms (min ${Math.min(...analysisTimes).toFixed(1)}, max ${Math.max(...analysisTimes).toFixed(1)}, ${TIMED_RUNS} runs)`,
);
console.log(`ratio analysis / decoding: ${(analysisMs / decodeMs).toFixed(2)} (goal: below 1)`);
console.log(
  `peak resident memory: ${peakAfterDecoding.toFixed(0)} MB after the decoding runs, ${peakAfterAnalysis.toFixed(0)} MB after ${WARM_UP_RUNS + TIMED_RUNS} analyses; result JSON ${(JSON.stringify(result).length / 1e3).toFixed(0)} kB`,
);
console.log(
  `sanity: bias ${result.bias.percent?.toFixed(2)} % (simulated ${pair.truth.instrumentBiasPercent.toFixed(2)} %), clock offset ${result.alignment.clockOffsetSeconds} s (simulated ${pair.truth.clockOffsetSeconds} s)`,
);
