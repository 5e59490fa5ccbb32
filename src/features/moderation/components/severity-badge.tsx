const STYLE = [
  'bg-moss-100 text-moss-700',
  'bg-fjord-100 text-fjord-900',
  'bg-caution-100 text-caution-600',
  'bg-alert-100 text-alert-800',
];
const WORDS = ['No flags', 'Notes', 'Check', 'Problem'];

/** A submission's worst flag, as the queue sorts by it. */
export function SeverityBadge({ severity }: { severity: number }) {
  const level = Math.max(0, Math.min(3, severity));
  return <span className={`inline-block rounded-full px-2.5 py-0.5 text-caption font-semibold ${STYLE[level]}`}>{WORDS[level]}</span>;
}
