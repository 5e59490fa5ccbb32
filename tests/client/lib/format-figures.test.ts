import { describe, expect, it } from 'vitest';
import { formatDay } from '../../../src/lib/format-date';
import { byteSize, percentRange, signedPercent } from '../../../src/lib/format-figures';

describe('how figures and days are written', () => {
  it('when a percentage rounds to zero, then it reads "0.0 %" on every page, whatever its sign', () => {
    expect(signedPercent(-0.04)).toBe('0.0 %');
    expect(signedPercent(0.04)).toBe('0.0 %');
    expect(signedPercent(0)).toBe('0.0 %');
  });

  it('when a percentage is negative or positive, then it carries a real minus sign or a plus', () => {
    expect(signedPercent(-1.26)).toBe('\u22121.3 %');
    expect(signedPercent(1.84)).toBe('+1.8 %');
    expect(signedPercent(null)).toBe('–');
    expect(percentRange(-4.21, -0.01)).toBe('\u22124.2 to 0.0 %');
  });

  it('when a day or a time is shown, then it reads day, month name and year', () => {
    expect(formatDay('2026-12-02')).toBe('2 Dec 2026');
    expect(formatDay('2026-12-02T23:30:00Z')).toBe('2 Dec 2026');
  });

  it('when a size in bytes is shown, then it reads in decimal units with one decimal below ten', () => {
    expect(byteSize(0)).toBe('0\u00a0B');
    expect(byteSize(999)).toBe('999\u00a0B');
    expect(byteSize(1234)).toBe('1.2\u00a0kB');
    expect(byteSize(48_300_000)).toBe('48\u00a0MB');
    expect(byteSize(5_600_000_000)).toBe('5.6\u00a0GB');
  });
});
