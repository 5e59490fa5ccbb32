// Before the clock offset is known, a dropout can only be guessed from one device's
// own recording. Such guesses are masked (set to "no data") while aligning, so a
// dozen silent stretches in one file cannot pull the correlation off the ride.
const PEDALLING_CADENCE_RPM = 30;
const RIDING_POWER_WATTS = 50;
/** Zero stretches up to this long between riding seconds look like radio losses, not stops. */
const MAX_SHORT_SILENCE_SECONDS = 20;
/** How far on each side of a short silence the device must read riding power. */
const FLANK_SECONDS = 2;

/**
 * Power with NaN where it is zero or missing while the device's own cadence says the
 * rider pedals, and over short silences flanked by riding power on both sides.
 */
export function maskCandidatePowerDropouts(power: Float64Array, cadence: Float64Array): Float64Array {
  const masked = Float64Array.from(power);
  for (let i = 0; i < power.length; i++) if (!(power[i] > 0) && cadence[i] >= PEDALLING_CADENCE_RPM) masked[i] = NaN;
  for (let i = 0; i < power.length; i++) {
    if (power[i] > 0) continue;
    let end = i;
    while (end < power.length && !(power[end] > 0)) end++;
    if (end - i <= MAX_SHORT_SILENCE_SECONDS && ridingNear(power, i - FLANK_SECONDS, i) && ridingNear(power, end, end + FLANK_SECONDS))
      masked.fill(NaN, i, end);
    i = end;
  }
  return masked;
}

/** Cadence with NaN where it is zero or missing while the device's own power says the rider pedals. */
export function maskCandidateCadenceDropouts(cadence: Float64Array, power: Float64Array): Float64Array {
  const masked = Float64Array.from(cadence);
  for (let i = 0; i < cadence.length; i++) if (!(cadence[i] > 0) && power[i] >= RIDING_POWER_WATTS) masked[i] = NaN;
  return masked;
}

function ridingNear(power: Float64Array, from: number, to: number): boolean {
  if (from < 0 || to > power.length) return false;
  for (let i = from; i < to; i++) if (power[i] >= RIDING_POWER_WATTS) return true;
  return false;
}
