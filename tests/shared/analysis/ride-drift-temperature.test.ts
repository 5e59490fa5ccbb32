import { describe, expect, it } from 'vitest';
import { compareFitFiles } from '@shared/analysis/compare-recordings';
import { simulatePair, type MeterSpec } from '@shared/simulator/pair';

const HOUR = 3600;
const DIRECT = { aPosition: 'total', bPosition: 'total' } as const;
const SENSOR = { productId: 7, serialNumber: 4242, softwareVersion: 2.1 };

function ride(a: Partial<MeterSpec>) {
  const pair = simulatePair({
    seed: 1818,
    durationSeconds: 2 * HOUR,
    profile: 'endurance',
    a: { position: 'total', ...a },
    b: { position: 'total' },
  });
  return compareFitFiles(pair.a, pair.b, DIRECT);
}

describe('a ride that warms up', () => {
  it('when A creeps 1.5 % per hour, then the drift is measured and flagged with the caution to zero before riding', () => {
    const result = ride({ driftPercentPerHour: 1.5 });

    expect(result.drift!.percentPerHour).toBeGreaterThan(1.2);
    expect(result.drift!.percentPerHour).toBeLessThan(1.8);
    expect(result.drift!.lower).toBeLessThan(1.5);
    expect(result.drift!.upper).toBeGreaterThan(1.5);
    const flag = result.flags.find((f) => f.code === 'difference_drift');
    expect(flag).toMatchObject({ severity: 'warning' });
    expect(flag!.message).toMatch(/grows by 1\.\d points per hour.*not while riding/);
  });

  it('when neither meter drifts, then there is no drift flag', () => {
    const result = ride({});
    expect(result.drift).not.toBeNull();
    expect(result.flags.map((f) => f.code)).not.toContain('difference_drift');
  });

  it('when the head unit records 2 °C rising to 12 °C, then the ride carries its range and the bias per band', () => {
    const result = ride({ scale: 1.02, temperature: { startCelsius: 2, changePerHour: 5 } });

    expect(result.temperature).toMatchObject({ minCelsius: 2, maxCelsius: 12 });
    expect(result.temperature!.bands.map((b) => b.band)).toEqual(['below 5 °C', '5 to 15 °C']);
    // Both bands see the same 2 % scale error: a meter that does not drift reads alike in each.
    for (const band of result.temperature!.bands) expect(band.percent!).toBeCloseTo(2, 0);
    // 2 → 5 °C takes 36 min of the 120 (rounded to whole degrees the file stores: below 4.5 °C is "4")
    const cold = result.temperature!.bands[0]!.seconds / (result.temperature!.bands[0]!.seconds + result.temperature!.bands[1]!.seconds);
    expect(cold).toBeGreaterThan(0.2);
    expect(cold).toBeLessThan(0.35);
  });

  it('when A reads 0.5 % low per °C below 10 °C on a ride from 0 °C to 20 °C, then the cold band shows it and the warm band does not', () => {
    const temperature = { startCelsius: 0, changePerHour: 10 };
    const pair = simulatePair({
      seed: 1819,
      durationSeconds: 2 * HOUR,
      profile: 'endurance',
      a: { position: 'total', temperature, coldResponse: { belowCelsius: 10, percentPerDegree: 0.5 } },
      b: { position: 'total', temperature },
    });
    const result = compareFitFiles(pair.a, pair.b, DIRECT);

    const band = (label: string) => result.temperature!.bands.find((b) => b.band === label)!.percent!;
    // Below 5 °C the air averages about 2.5 °C: 7.5 °C below the threshold × 0.5 % = −3.75 % (the simulator's own rule).
    expect(band('below 5 °C')).toBeGreaterThan(-4.3);
    expect(band('below 5 °C')).toBeLessThan(-3.2);
    expect(Math.abs(band('15 to 25 °C'))).toBeLessThan(0.4);
    // The truth the simulator reports includes the cold: the whole ride's bias matches it.
    expect(result.bias.percent).toBeCloseTo(pair.truth.biasPercent, 0);
  });

  it('when no file records temperature, then there is none', () => {
    expect(ride({}).temperature).toBeNull();
  });

  it("when the sensor reports its battery going from good to low, then each change is on the ride's own seconds", () => {
    const result = ride({
      sensor: SENSOR,
      sensorBattery: [
        { atFraction: 0.1, status: 2, volts: 2.95 },
        { atFraction: 0.5, status: 2, volts: 2.95 },
        { atFraction: 0.9, status: 4, volts: 2.6 },
      ],
    });

    // FIT battery_status 2 good, 4 low; battery_voltage stored in 1/256 V (FIT SDK profile)
    expect(result.battery!.a.map((r) => r.status)).toEqual([2, 4]);
    expect(result.battery!.a[1]!.volts).toBeCloseTo(2.6, 2);
    expect(result.battery!.a[1]!.atSeconds).toBeGreaterThan(0.85 * 2 * HOUR);
    expect(result.battery!.a[1]!.atSeconds).toBeLessThan(0.95 * 2 * HOUR);
    expect(result.battery!.b).toEqual([]);
  });
});
