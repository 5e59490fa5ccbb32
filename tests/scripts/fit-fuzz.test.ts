import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readRideStream } from '@shared/analysis/decode-fit';
import { createRandom } from '@shared/simulator/random';
import { FAILURE_OUTCOMES, runFitFuzz } from '../../scripts/lib/fit-fuzz-campaign';
import { fuzzSeedPairs } from '../../scripts/lib/fit-fuzz-seeds';
import { fitLayout, mutateFit } from '../../scripts/lib/fit-mutations';

const keepDir = mkdtempSync(join(tmpdir(), 'crosswatt-fuzz-'));
afterAll(() => rmSync(keepDir, { recursive: true, force: true }));

const seedFile = fuzzSeedPairs()[0].a;
const layout = fitLayout(seedFile);

describe('FIT mutations', () => {
  it('when the same seed is used twice, then the mutants are byte for byte the same', () => {
    const first = createRandom(31);
    const second = createRandom(31);

    for (let i = 0; i < 50; i++) expect(mutateFit(seedFile, layout, first).bytes).toEqual(mutateFit(seedFile, layout, second).bytes);
  });

  it("when a mutant's checksums are recomputed, then our reader never refuses it for its checksum, so it reaches the parser", () => {
    const random = createRandom(32);
    const refusals: string[] = [];
    let recomputed = 0;

    for (let i = 0; i < 400; i++) {
      const mutant = mutateFit(seedFile, layout, random);
      if (!mutant.crcRecomputed) continue;
      recomputed++;
      try {
        readRideStream(mutant.bytes);
      } catch (err) {
        refusals.push((err as Error).message);
      }
    }

    expect(recomputed).toBeGreaterThan(150);
    expect(refusals.filter((message) => /checksum does not match its contents/.test(message))).toEqual([]);
  });
});

describe('a bounded fuzz run (npm run fuzz:fit)', () => {
  it('when 3,000 mutants run through decode, the upload checks and the comparison, then none crashes, hangs, throws an untyped error or runs out of memory, and the parser refuses them in many ways', async () => {
    const summary = await runFitFuzz({ count: 3000, seed: 2026, keepDir, threads: 2, timeLimitMs: 20_000, reference: false });

    expect(summary.mutants).toBe(3000);
    for (const failure of FAILURE_OUTCOMES)
      expect(summary.outcomes[failure] ?? 0, `${failure}: ${JSON.stringify(summary.failures.slice(0, 3))}`).toBe(0);
    expect(readdirSync(keepDir)).toEqual([]);
    for (const code of ['damaged_file', 'ended_early', 'not_fit', 'implausible_timestamps', 'too_short'])
      expect(summary.outcomes[`refused:${code}`] ?? 0, code).toBeGreaterThan(0);
    expect(summary.outcomes.accepted ?? 0).toBeGreaterThan(0);
  }, 120_000);

  it("when mutants are read by the FIT SDK's Decoder too, then we never refuse as damaged a file the SDK reads cleanly with power, and never read one differently", async () => {
    const summary = await runFitFuzz({ count: 300, seed: 2027, threads: 2, timeLimitMs: 20_000 });

    expect(summary.reference.sdkReadable).toBeGreaterThan(20);
    expect(summary.disagreements).toEqual([]);
    expect(summary.reference.weRefuseWhatSdkReads + summary.reference.streamsDiffer).toBe(0);
  }, 120_000);
});
