/** The ordinary median of a multiset given as value → count (mean of the two middle values when even); null when empty. */
export function medianOfHistogram(histogram: { value: number; count: number }[]): number | null {
  const bins = histogram.filter((bin) => bin.count > 0).sort((x, y) => x.value - y.value);
  const total = bins.reduce((sum, bin) => sum + bin.count, 0);
  if (total === 0) return null;
  const valueAt = (rank: number) => {
    let seen = 0;
    for (const bin of bins) {
      seen += bin.count;
      if (rank < seen) return bin.value;
    }
    return bins[bins.length - 1].value;
  };
  return total % 2 === 1 ? valueAt((total - 1) / 2) : (valueAt(total / 2 - 1) + valueAt(total / 2)) / 2;
}
