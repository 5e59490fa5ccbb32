export function NotEnoughData() {
  return <span className="text-caption italic text-ink-faint">not enough data yet</span>;
}
