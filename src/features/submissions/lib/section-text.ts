import { signedPercent } from '@/lib/format-figures';
import type { SectionFigures } from '@shared/analysis/section-figures';
import { formatClock, formatSignedWatts, formatWatts } from './format';

/** One line a reviewer can paste into an article: the section, both averages, the difference and the peaks. */
export function sectionText(figures: SectionFigures, names: { a: string; b: string }): string {
  const span = `${formatClock(figures.fromSeconds)}–${formatClock(figures.toSeconds)}`;
  if (figures.matchedSeconds === 0) return `${span}: no second where both meters reported power.`;
  return (
    `${span} (${figures.matchedSeconds} s matched): ${names.a} ${formatWatts(figures.aAverageWatts)} against ${names.b} ${formatWatts(figures.bAverageWatts)}, ` +
    `difference ${formatSignedWatts(figures.differenceWatts, 1)} (${signedPercent(figures.differencePercent)}); ` +
    `peaks ${formatWatts(figures.aPeakWatts)} and ${formatWatts(figures.bPeakWatts)}.`
  );
}
