import { describe, expect, it } from 'vitest';
import { createRandom, deriveSeed } from '@shared/simulator/random';

describe('seeded randomness', () => {
  it('when two generators share a seed, then they produce the same sequence', () => {
    const first = createRandom(42);
    const second = createRandom(42);

    const a = Array.from({ length: 100 }, () => first.normal() + first.next());
    const b = Array.from({ length: 100 }, () => second.normal() + second.next());

    expect(a).toEqual(b);
  });

  it('when the seeds differ, then the sequences differ', () => {
    expect(createRandom(1).next()).not.toBe(createRandom(2).next());
  });

  it('when many normal deviates are drawn, then their mean is near 0 and their SD near 1', () => {
    const random = createRandom(7);
    const n = 50_000;
    let sum = 0;
    let sumSquares = 0;

    for (let i = 0; i < n; i += 1) {
      const x = random.normal();
      sum += x;
      sumSquares += x * x;
    }
    const mean = sum / n;
    const sd = Math.sqrt(sumSquares / n - mean * mean);

    expect(Math.abs(mean)).toBeLessThan(0.02);
    expect(Math.abs(sd - 1)).toBeLessThan(0.02);
  });

  it('when Poisson deviates are drawn, then their mean matches the requested mean', () => {
    const random = createRandom(3);
    const draws = Array.from({ length: 20_000 }, () => random.poisson(2.5));

    const mean = draws.reduce((sum, x) => sum + x, 0) / draws.length;

    expect(mean).toBeCloseTo(2.5, 1);
  });

  it('when sub-streams are derived from one seed with different labels, then their seeds differ and are stable', () => {
    expect(deriveSeed(5, 'meter-a')).not.toBe(deriveSeed(5, 'meter-b'));
    expect(deriveSeed(5, 'meter-a')).toBe(deriveSeed(5, 'meter-a'));
  });
});
