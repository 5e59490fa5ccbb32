// How Crosswatt writes its figures: units always, uncertainty always, a true minus
// sign, an explicit plus for differences, and "–" for a figure the method could not
// give. A value that rounds to zero is written without a sign ("0.0 %", never
// "−0.0 %" or "+0.0 %"), whichever page shows it.

export const MINUS = '\u2212';
export const NONE = '–';

/** -0.04 → "0.0", -1.23 → "−1.2": a real minus sign, none on a rounded zero. */
export function plain(value: number, digits: number): string {
  const text = Math.abs(value).toFixed(digits);
  return Number(text) !== 0 && value < 0 ? `${MINUS}${text}` : text;
}

/** -1.23 → "−1.2", 1.23 → "+1.2", 0.04 → "0.0". */
export function signed(value: number, digits: number): string {
  const text = plain(value, digits);
  return Number(Math.abs(value).toFixed(digits)) !== 0 && value > 0 ? `+${text}` : text;
}

/** The one signed-percent formatter: "+1.8 %", "−0.4 %", "0.0 %", "–" when there is no figure. */
export function signedPercent(value: number | null | undefined, digits = 1): string {
  return value == null ? NONE : `${signed(value, digits)} %`;
}

/** `+1.8 % ± 0.6` for a symmetric interval given by its bounds. */
export function percentPlusMinus(mean: number, lower: number, upper: number, digits = 1): string {
  return `${signedPercent(mean, digits)} ± ${((upper - lower) / 2).toFixed(digits)}`;
}

export function percentRange(lower: number, upper: number, digits = 1): string {
  return `${plain(lower, digits)} to ${plain(upper, digits)} %`;
}

export function perHour(value: number): string {
  return `${value < 0.1 ? value.toFixed(3) : value.toFixed(2)} /h`;
}

export function hours(value: number): string {
  return `${value < 10 ? value.toFixed(1) : Math.round(value)} h`;
}

export function ratio(value: number | null, lower: number, upper: number | null): string {
  const r = value === null ? '—' : value.toFixed(2);
  return `${r} × (${lower.toFixed(2)} to ${upper === null ? '∞' : upper.toFixed(2)})`;
}

export function pValue(p: number): string {
  return p < 0.001 ? 'p < 0.001' : `p = ${p.toFixed(3)}`;
}

export function seconds(value: number): string {
  return `${plain(value, Number.isInteger(value) ? 0 : 1)} s`;
}

/** 0 → "0 B", 1234 → "1.2 kB", 5.6e9 → "5.6 GB" (decimal units, as storage providers bill; the number and unit never part). */
export function byteSize(bytes: number): string {
  const units = ['B', 'kB', 'MB', 'GB', 'TB'];
  let value = bytes;
  let unit = 0;
  while (value >= 1000 && unit < units.length - 1) {
    value /= 1000;
    unit++;
  }
  return `${unit === 0 ? value : value.toFixed(value < 10 ? 1 : 0)}\u00a0${units[unit]}`;
}
