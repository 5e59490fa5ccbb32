/**
 * Pearson correlation of x[i] and y[i + lag] over the indexes where both are
 * numbers; NaN with fewer than minPairs pairs or no variation.
 */
export function laggedCorrelation(x: Float64Array, y: Float64Array, lag: number, minPairs = 2): { r: number; pairs: number } {
  const from = Math.max(0, -lag);
  const to = Math.min(x.length, y.length - lag);
  let n = 0;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  for (let i = from; i < to; i++) {
    const xi = x[i];
    const yi = y[i + lag];
    if (xi !== xi || yi !== yi) continue; // NaN check without a call in the hot loop
    n++;
    sx += xi;
    sy += yi;
    sxx += xi * xi;
    syy += yi * yi;
    sxy += xi * yi;
  }
  if (n < minPairs) return { r: NaN, pairs: n };
  const covariance = sxy - (sx * sy) / n;
  const varianceX = sxx - (sx * sx) / n;
  const varianceY = syy - (sy * sy) / n;
  if (varianceX <= 0 || varianceY <= 0) return { r: NaN, pairs: n };
  return { r: covariance / Math.sqrt(varianceX * varianceY), pairs: n };
}

/** Lag in [minLag, maxLag] with the highest correlation; null when none is defined. */
export function bestLag(
  x: Float64Array,
  y: Float64Array,
  lags: Iterable<number>,
  minPairs: number,
): { lag: number; r: number; pairs: number } | null {
  let best: { lag: number; r: number; pairs: number } | null = null;
  for (const lag of lags) {
    const { r, pairs } = laggedCorrelation(x, y, lag, minPairs);
    if (!Number.isNaN(r) && (best === null || r > best.r)) best = { lag, r, pairs };
  }
  return best;
}

export function range(from: number, to: number, step = 1): number[] {
  const values: number[] = [];
  for (let v = from; v <= to; v += step) values.push(v);
  return values;
}

/** Mean of the numbers in each window of `width` around i (centred), NaN where there are none. */
export function movingMean(values: Float64Array, width: number): Float64Array {
  const half = Math.floor(width / 2);
  const out = new Float64Array(values.length);
  let sum = 0;
  let count = 0;
  // Window [i - half, i + width - half - 1], slid one step at a time.
  for (let j = 0; j < Math.min(width - half - 1, values.length); j++) {
    if (values[j] === values[j]) {
      sum += values[j];
      count++;
    }
  }
  for (let i = 0; i < values.length; i++) {
    const entering = i + width - half - 1;
    if (entering < values.length && values[entering] === values[entering]) {
      sum += values[entering];
      count++;
    }
    const leaving = i - half - 1;
    if (leaving >= 0 && values[leaving] === values[leaving]) {
      sum -= values[leaving];
      count--;
    }
    out[i] = count > 0 ? sum / count : NaN;
  }
  return out;
}

/** Means of consecutive blocks of `width` values (NaN-skipping). */
export function blockMeans(values: Float64Array, width: number): Float64Array {
  const out = new Float64Array(Math.floor(values.length / width));
  for (let block = 0; block < out.length; block++) {
    let sum = 0;
    let count = 0;
    for (let i = block * width; i < (block + 1) * width; i++) {
      if (values[i] === values[i]) {
        sum += values[i];
        count++;
      }
    }
    out[block] = count > 0 ? sum / count : NaN;
  }
  return out;
}

/** Mean of the numbers among values[i − width + 1 … i] (a head unit's trailing average), NaN where there are none. */
export function trailingMean(values: Float64Array, width: number): Float64Array {
  const out = new Float64Array(values.length);
  let sum = 0;
  let count = 0;
  for (let i = 0; i < values.length; i++) {
    if (values[i] === values[i]) {
      sum += values[i];
      count++;
    }
    const leaving = i - width;
    if (leaving >= 0 && values[leaving] === values[leaving]) {
      sum -= values[leaving];
      count--;
    }
    out[i] = count > 0 ? sum / count : NaN;
  }
  return out;
}
