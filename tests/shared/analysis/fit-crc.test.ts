import { describe, expect, it } from 'vitest';
import { crc16Arc } from '@shared/analysis/fit-crc';

describe('FIT CRC', () => {
  it('when the catalogue check string is hashed, then CRC-16/ARC gives 0xBB3D', () => {
    const check = new TextEncoder().encode('123456789');

    // CRC catalogue (reveng), CRC-16/ARC: check = 0xbb3d.
    expect(crc16Arc(check)).toBe(0xbb3d);
  });

  it('when a range is given, then only those bytes are hashed', () => {
    const padded = new TextEncoder().encode('xx123456789yy');

    expect(crc16Arc(padded, 2, 11)).toBe(0xbb3d);
  });

  it('when nothing is hashed, then the CRC is the initial value 0', () => {
    expect(crc16Arc(new Uint8Array(0))).toBe(0);
  });
});
