// A small picture of a figure and its 95 % interval on a fixed scale around zero,
// so that a wide interval looks wide at a glance. Decorative: the figure is in the text.
export function IntervalBar({ mean, lower, upper, span = 6 }: { mean: number; lower: number; upper: number; span?: number }) {
  const x = (value: number) => 50 + (Math.max(-span, Math.min(span, value)) / span) * 50;
  return (
    <svg viewBox="0 0 100 12" className="h-4 w-28 shrink-0" aria-hidden="true" preserveAspectRatio="none">
      <line x1="50" x2="50" y1="0" y2="12" className="stroke-ink-faint" strokeWidth="0.8" strokeDasharray="1.5 1.5" />
      <rect
        x={x(lower)}
        width={Math.max(1, x(upper) - x(lower))}
        y="3"
        height="6"
        rx="3"
        className="fill-ember-100 stroke-ember-300"
        strokeWidth="0.6"
      />
      <rect x={x(mean) - 1} width="2" y="1" height="10" className="fill-ember-700" />
    </svg>
  );
}
