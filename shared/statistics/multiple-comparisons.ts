/**
 * Holm's step-down adjustment (Holm, Scand J Statist 1979;6:65–70): the k-th
 * smallest of m p-values is multiplied by m − k + 1, made non-decreasing and
 * capped at 1. Controls the chance of any false "difference" among the m at the
 * nominal level. R: p.adjust(p, "holm"). Null entries (no test) stay null and
 * do not count towards m.
 */
export function holmAdjust(pValues: (number | null)[]): (number | null)[] {
  const tested = pValues.map((p, index) => ({ p, index })).filter((e): e is { p: number; index: number } => e.p !== null);
  tested.sort((x, y) => x.p - y.p);
  const adjusted: (number | null)[] = pValues.map(() => null);
  let running = 0;
  tested.forEach(({ p, index }, rank) => {
    running = Math.max(running, Math.min(1, (tested.length - rank) * p));
    adjusted[index] = running;
  });
  return adjusted;
}
