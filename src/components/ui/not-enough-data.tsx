/** Where a figure is missing: "riders" when it needs more riders (the minimum evidence is counted in riders). */
export function NotEnoughData({ riders = false }: { riders?: boolean }) {
  return <span className="text-caption italic text-ink-faint">{riders ? 'not enough riders yet' : 'not enough data yet'}</span>;
}
