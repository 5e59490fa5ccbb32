// How Crosswatt writes its figures: units always, uncertainty always, a true minus sign.

const minus = (text: string) => text.replace('-', '−');

export function signedPercent(value: number, digits = 1): string {
  const text = value.toFixed(digits);
  return `${value > 0 && Number(text) !== 0 ? '+' : ''}${minus(text)} %`;
}

/** `+1.8 % ± 0.6` for a symmetric interval given by its bounds. */
export function percentPlusMinus(mean: number, lower: number, upper: number, digits = 1): string {
  return `${signedPercent(mean, digits)} ± ${((upper - lower) / 2).toFixed(digits)}`;
}

export function percentRange(lower: number, upper: number, digits = 1): string {
  return `${minus(lower.toFixed(digits))} to ${minus(upper.toFixed(digits))} %`;
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
  return `${minus(value.toFixed(Number.isInteger(value) ? 0 : 1))} s`;
}
