import { describe, expect, it } from 'vitest';
import { createRandom, type Random } from '@shared/simulator/random';
import { fitConsensusOffsets, type ConsensusEdge } from '@shared/statistics/consensus';

type Offsets = Record<string, number>;

/** Ring (so every combination has two partners and the network is connected) plus random chords. */
function simulatedNetwork(random: Random, truth: Offsets, chords: number, noiseSd: number): ConsensusEdge<string>[] {
  const ids = Object.keys(truth);
  const pairs: [string, string][] = ids.map((id, i) => [id, ids[(i + 1) % ids.length]]);
  while (pairs.length < ids.length + chords) {
    const a = ids[random.integer(0, ids.length - 1)];
    const b = ids[random.integer(0, ids.length - 1)];
    if (a !== b) pairs.push([a, b]);
  }
  return pairs.map(([a, b]) => {
    const weight = random.uniform(0.5, 4);
    return { a, b, weight, logRatio: truth[a] - truth[b] + (noiseSd / Math.sqrt(weight)) * random.normal() };
  });
}

/** The injected offsets shifted to the fit's own zero: weighted by each combination's total edge weight. */
function centred(truth: Offsets, edges: ConsensusEdge<string>[]): Offsets {
  const omega: Record<string, number> = {};
  for (const edge of edges) {
    omega[edge.a] = (omega[edge.a] ?? 0) + edge.weight;
    omega[edge.b] = (omega[edge.b] ?? 0) + edge.weight;
  }
  const ids = Object.keys(omega);
  const level = ids.reduce((sum, id) => sum + omega[id] * truth[id], 0) / ids.reduce((sum, id) => sum + omega[id], 0);
  return Object.fromEntries(ids.map((id) => [id, truth[id] - level]));
}

describe('consensus offsets', () => {
  it('when the comparisons carry no noise, then the injected offsets are recovered exactly', () => {
    const truth = { p: 0.03, q: -0.01, r: 0.0, s: 0.05, t: -0.04, u: 0.015 };
    const edges = simulatedNetwork(createRandom(1), truth, 6, 0);
    const expected = centred(truth, edges);

    const fit = fitConsensusOffsets(edges);

    expect(fit.offsets).toHaveLength(6);
    for (const offset of fit.offsets) {
      expect(offset.offsetLog).toBeCloseTo(expected[offset.comboId], 12);
      expect(offset.offsetPercent).toBeCloseTo(100 * Math.expm1(expected[offset.comboId]), 10);
      expect(offset.standardErrorLog).toBeCloseTo(0, 12);
    }
  });

  it('when the fit is done, then the weighted mean of the offsets is zero', () => {
    const edges = simulatedNetwork(createRandom(2), { a: 0.1, b: 0.2, c: -0.1, d: 0.05 }, 5, 0.02);

    const fit = fitConsensusOffsets(edges);

    const weightOf = (id: string) => edges.filter((e) => e.a === id || e.b === id).reduce((sum, e) => sum + e.weight, 0);
    const level = fit.offsets.reduce((sum, o) => sum + weightOf(o.comboId) * o.offsetLog, 0);
    expect(level).toBeCloseTo(0, 12);
  });

  it('when the network falls apart into two components, then each is fitted with its own zero level', () => {
    const first = { a: 0.02, b: -0.03, c: 0.04 };
    const second = { x: 0.3, y: 0.1, z: 0.2, w: 0.0 };
    const random = createRandom(3);
    const edges = [...simulatedNetwork(random, first, 2, 0), ...simulatedNetwork(random, second, 3, 0)];
    const expected = { ...centred(first, edges.slice(0, 5)), ...centred(second, edges.slice(5)) };

    const fit = fitConsensusOffsets(edges);

    expect(fit.components.map((c) => [c.comboCount, c.edgeCount])).toEqual([
      [3, 5],
      [4, 7],
    ]);
    for (const offset of fit.offsets) {
      expect(offset.component).toBe(offset.comboId in first ? 0 : 1);
      expect(offset.offsetLog).toBeCloseTo(expected[offset.comboId as keyof typeof expected], 12);
    }
  });

  it('when a combination has been compared with only one other, then it is fitted but not reportable', () => {
    const edges: ConsensusEdge<number>[] = [
      { a: 1, b: 2, logRatio: 0.01, weight: 1 },
      { a: 2, b: 3, logRatio: 0.02, weight: 1 },
      { a: 1, b: 2, logRatio: 0.012, weight: 2 },
    ];

    const fit = fitConsensusOffsets(edges);

    expect(fit.offsets.map((o) => [o.comboId, o.connectedTo, o.reportable])).toEqual([
      [1, 1, false],
      [2, 2, true],
      [3, 1, false],
    ]);
  });

  it('when the comparisons form a tree, then there is no residual spread and no standard error', () => {
    const fit = fitConsensusOffsets([
      { a: 'a', b: 'b', logRatio: 0.01, weight: 1 },
      { a: 'b', b: 'c', logRatio: 0.02, weight: 1 },
    ]);

    expect(fit.components[0].degreesOfFreedom).toBe(0);
    expect(fit.offsets.every((o) => o.standardErrorLog === null && o.lowerPercent === null)).toBe(true);
  });

  it('when a combination is compared with itself, then that comparison is ignored', () => {
    const edges = [
      { a: 'a', b: 'b', logRatio: 0.01, weight: 1 },
      { a: 'b', b: 'c', logRatio: 0.02, weight: 1 },
      { a: 'c', b: 'a', logRatio: -0.03, weight: 1 },
    ];

    const withSelf = fitConsensusOffsets([...edges, { a: 'b', b: 'b', logRatio: 0.5, weight: 3 }]);

    expect(withSelf).toEqual(fitConsensusOffsets(edges));
  });

  it('when an edge has no weight, then it is refused', () => {
    expect(() => fitConsensusOffsets([{ a: 'a', b: 'b', logRatio: 0, weight: 0 }])).toThrow(RangeError);
  });

  it('when noisy networks are fitted over many seeded trials, then the 95 % intervals cover the injected offsets at about the nominal rate', () => {
    const random = createRandom(7);
    let covered = 0;
    let total = 0;
    for (let trial = 0; trial < 300; trial++) {
      const truth = Object.fromEntries(Array.from({ length: 10 }, (_, i) => [`m${i}`, 0.05 * random.normal()]));
      const edges = simulatedNetwork(random, truth, 25, 0.02);
      const expected = centred(truth, edges);

      for (const offset of fitConsensusOffsets(edges).offsets) {
        const lower = Math.log1p(offset.lowerPercent! / 100);
        const upper = Math.log1p(offset.upperPercent! / 100);
        if (lower <= expected[offset.comboId] && expected[offset.comboId] <= upper) covered++;
        total++;
      }
    }

    expect(covered / total).toBeGreaterThan(0.85);
    expect(covered / total).toBeLessThan(0.99);
  });
});
