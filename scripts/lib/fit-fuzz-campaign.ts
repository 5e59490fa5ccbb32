// A fuzzing campaign over our FIT reader and the engine behind it (npm run fuzz:fit,
// and a bounded run in the tests): seeded mutants of valid files, each run as an
// upload would run it (decode, the upload's checks, the comparison with its
// unmutated partner) in a worker thread with a time and a heap limit, and read by
// the FIT SDK's Decoder beside ours. Mutant i depends only on the seed and i.
import { mkdirSync, writeFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import Piscina from 'piscina';
import type { Side } from '@shared/analysis/types';
import { createRandom, deriveSeed } from '@shared/simulator/random';
import { taskFailureReason } from '../../server/features/submissions/recording-tasks';
import { tsxExecArgv } from '../../server/lib/tsx-exec-argv';
import { fuzzSeedPairs, type SeedPair } from './fit-fuzz-seeds';
import type { EngineVerdict, FuzzTask, ReferenceVerdict } from './fit-fuzz.worker';
import { type FitLayout, fitLayout, type Mutant, mutateFit } from './fit-mutations';

export interface FuzzOptions {
  count: number;
  seed: number;
  /** Where failing inputs (and SDK disagreements) are written; none kept when absent. */
  keepDir?: string;
  threads?: number;
  /** Per mutant and step; a mutant that takes longer is a hang. */
  timeLimitMs?: number;
  /** Per worker thread (old generation); a thread that dies on it is an out-of-memory. */
  heapLimitMb?: number;
  /** Also read every mutant with the FIT SDK's Decoder (default true). */
  reference?: boolean;
  onProgress?: (done: number) => void;
}

/** accepted, refused:<code>, or a failure. */
export type FuzzOutcome = 'accepted' | `refused:${string}` | FuzzFailureOutcome;
export type FuzzFailureOutcome = 'crash' | 'hang' | 'untyped' | 'oom';
export const FAILURE_OUTCOMES: readonly FuzzFailureOutcome[] = ['crash', 'hang', 'untyped', 'oom'];

export interface KeptInput {
  index: number;
  outcome: string;
  seedFile: string;
  steps: string[];
  detail: string;
  path?: string;
}

export interface FuzzSummary {
  mutants: number;
  /** Count per outcome (accepted, refused:<code>, crash, hang, untyped, oom). */
  outcomes: Record<string, number>;
  /** Mutants whose checksums were recomputed, and how many of those our reader refused as damaged or cut off. */
  crcRecomputed: number;
  reference: {
    /** The SDK read the mutant cleanly. */
    sdkReadable: number;
    /** The SDK read it cleanly with power records and we refused it as damaged, cut off or not FIT. */
    weRefuseWhatSdkReads: number;
    /** Both read it, and the streams differ. */
    streamsDiffer: number;
    /** We read it and the SDK could not (compressed timestamps, and the SDK's stricter checks). */
    sdkRefusesWhatWeRead: number;
    /** The SDK's own reading ran out of time or died (not counted against us). */
    sdkFailed: number;
  };
  failures: KeptInput[];
  disagreements: KeptInput[];
  elapsedMs: number;
}

const DAMAGE_CODES = new Set(['damaged_file', 'ended_early', 'not_fit']);
const MAX_KEPT_DISAGREEMENTS = 50;

interface SeedFile {
  name: string;
  bytes: Uint8Array;
  layout: FitLayout;
  side: Side;
  pair: SeedPair;
}

function seedFiles(): SeedFile[] {
  return fuzzSeedPairs().flatMap((pair) =>
    (['a', 'b'] as const).map((side) => ({ name: `${pair.name}-${side}`, bytes: pair[side], layout: fitLayout(pair[side]), side, pair })),
  );
}

/** Mutant `index` of the campaign with this seed: always the same bytes. */
function fuzzMutant(files: SeedFile[], seed: number, index: number): { file: SeedFile; mutant: Mutant } {
  const random = createRandom(deriveSeed(seed, `mutant ${index}`));
  const file = files[random.integer(0, files.length - 1)];
  return { file, mutant: mutateFit(file.bytes, file.layout, random) };
}

export async function runFitFuzz(options: FuzzOptions): Promise<FuzzSummary> {
  const started = performance.now();
  const threads = options.threads ?? Math.max(1, availableParallelism());
  const timeLimitMs = options.timeLimitMs ?? 10_000;
  const withReference = options.reference ?? true;
  const pool = new Piscina<FuzzTask, EngineVerdict | ReferenceVerdict>({
    filename: new URL('./fit-fuzz.worker.ts', import.meta.url).href,
    execArgv: tsxExecArgv(),
    minThreads: threads,
    maxThreads: threads,
    resourceLimits: { maxOldGenerationSizeMb: options.heapLimitMb ?? 256 },
  });
  const files = seedFiles();
  const summary: FuzzSummary = {
    mutants: 0,
    outcomes: {},
    crcRecomputed: 0,
    reference: { sdkReadable: 0, weRefuseWhatSdkReads: 0, streamsDiffer: 0, sdkRefusesWhatWeRead: 0, sdkFailed: 0 },
    failures: [],
    disagreements: [],
    elapsedMs: 0,
  };
  if (options.keepDir) mkdirSync(options.keepDir, { recursive: true });

  const keep = (list: KeptInput[], entry: KeptInput, bytes: Uint8Array) => {
    if (options.keepDir) {
      const base = join(options.keepDir, `${entry.outcome.replace(/[^a-z_-]/gi, '_')}-${options.seed}-${entry.index}-${entry.seedFile}`);
      writeFileSync(`${base}.fit`, bytes);
      writeFileSync(`${base}.txt`, `${JSON.stringify({ ...entry, seed: options.seed }, null, 2)}\n`);
      entry.path = `${base}.fit`;
    }
    list.push(entry);
  };

  const runOne = async (index: number) => {
    const { file, mutant } = fuzzMutant(files, options.seed, index);
    const partnerSide = file.side === 'a' ? 'b' : 'a';
    const task: FuzzTask = {
      kind: 'engine',
      mutant: mutant.bytes,
      mutantSide: file.side,
      partner: file.pair[partnerSide],
      partnerName: `${file.pair.name}-${partnerSide}`,
      options: file.pair.options,
    };
    let outcome: FuzzOutcome;
    let detail = '';
    try {
      const verdict = (await pool.run(task, { signal: AbortSignal.timeout(timeLimitMs) })) as EngineVerdict;
      outcome = verdict.outcome === 'refused' ? `refused:${verdict.code}` : verdict.outcome;
      if (verdict.outcome === 'untyped') detail = verdict.error;
    } catch (err) {
      outcome = { time: 'hang', memory: 'oom', crash: 'crash' }[taskFailureReason(err)] as FuzzFailureOutcome;
      detail = String(err);
    }
    summary.mutants++;
    summary.outcomes[outcome] = (summary.outcomes[outcome] ?? 0) + 1;
    if (mutant.crcRecomputed) summary.crcRecomputed++;
    const entry = { index, outcome, seedFile: file.name, steps: mutant.steps, detail };
    if ((FAILURE_OUTCOMES as readonly string[]).includes(outcome)) keep(summary.failures, entry, mutant.bytes);
    if (withReference) await compareWithReference(index, file, mutant);
    options.onProgress?.(summary.mutants);
  };

  const compareWithReference = async (index: number, file: SeedFile, mutant: Mutant) => {
    let verdict: ReferenceVerdict;
    try {
      verdict = (await pool.run(
        { kind: 'reference', mutant: mutant.bytes },
        { signal: AbortSignal.timeout(timeLimitMs) },
      )) as ReferenceVerdict;
    } catch {
      summary.reference.sdkFailed++;
      return;
    }
    const tally = summary.reference;
    if (verdict.sdkReadable) tally.sdkReadable++;
    let disagreement: string | null = null;
    if (verdict.sdkReadable && verdict.sdkPowerRecords > 0 && DAMAGE_CODES.has(verdict.ours)) {
      tally.weRefuseWhatSdkReads++;
      disagreement = `the SDK reads ${verdict.sdkPowerRecords} power records; we refuse it (${verdict.ours})`;
    } else if (verdict.difference !== null) {
      tally.streamsDiffer++;
      disagreement = `streams differ: ${verdict.difference}`;
    } else if (!verdict.sdkReadable && verdict.ours === 'read') {
      tally.sdkRefusesWhatWeRead++;
    }
    if (disagreement && summary.disagreements.length < MAX_KEPT_DISAGREEMENTS) {
      keep(
        summary.disagreements,
        { index, outcome: 'sdk-disagreement', seedFile: file.name, steps: mutant.steps, detail: disagreement },
        mutant.bytes,
      );
    }
  };

  // A few mutants in flight per thread; each is made when its turn comes, so memory stays flat.
  let next = 0;
  const lanes = Array.from({ length: threads * 2 }, async () => {
    while (next < options.count) await runOne(next++);
  });
  try {
    await Promise.all(lanes);
  } finally {
    await pool.close();
  }
  summary.elapsedMs = performance.now() - started;
  return summary;
}

/** The summary as the command prints it. */
export function formatFuzzSummary(summary: FuzzSummary, options: Pick<FuzzOptions, 'seed' | 'keepDir'>): string {
  const lines = [
    `${summary.mutants} mutants (seed ${options.seed}) in ${(summary.elapsedMs / 1000).toFixed(1)} s; checksums recomputed for ${summary.crcRecomputed}`,
  ];
  const sorted = Object.entries(summary.outcomes).sort(([x], [y]) => x.localeCompare(y));
  for (const [outcome, count] of sorted) lines.push(`  ${outcome.padEnd(32)} ${String(count).padStart(7)}`);
  for (const failure of FAILURE_OUTCOMES) if (!(failure in summary.outcomes)) lines.push(`  ${failure.padEnd(32)} ${'0'.padStart(7)}`);
  const r = summary.reference;
  lines.push(
    'FIT SDK Decoder on the same mutants:',
    `  read cleanly by the SDK            ${String(r.sdkReadable).padStart(7)}`,
    `  SDK disagreement: SDK reads power records, we refuse as damaged ${r.weRefuseWhatSdkReads}`,
    `  SDK disagreement: both read, streams differ ${r.streamsDiffer}`,
    `  we read, the SDK refuses (not a disagreement: compressed timestamps, the SDK's stricter checks) ${r.sdkRefusesWhatWeRead}`,
    `  the SDK's own reading failed or timed out ${r.sdkFailed}`,
  );
  for (const failure of summary.failures)
    lines.push(
      `${failure.outcome} #${failure.index} (${failure.seedFile}): ${failure.steps.join('; ')}${failure.path ? ` → ${failure.path}` : ''}\n    ${failure.detail.split('\n')[0]}`,
    );
  for (const disagreement of summary.disagreements.slice(0, 10))
    lines.push(
      `SDK disagreement #${disagreement.index} (${disagreement.seedFile}): ${disagreement.detail}; ${disagreement.steps.join('; ')}`,
    );
  if (options.keepDir && summary.failures.length + summary.disagreements.length > 0) lines.push(`inputs kept in ${options.keepDir}`);
  return lines.join('\n');
}

export function failureCount(summary: FuzzSummary): number {
  return FAILURE_OUTCOMES.reduce((n, outcome) => n + (summary.outcomes[outcome] ?? 0), 0);
}
