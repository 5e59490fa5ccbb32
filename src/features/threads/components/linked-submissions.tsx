import { signedPercent } from '@/lib/format-figures';
import { Link } from 'react-router-dom';
import type { LinkedSubmission } from '@shared/schemas/threads';

/** Evidence linked to a post: each submission's headline figures, inline. */
export function LinkedSubmissions({ submissions }: { submissions: LinkedSubmission[] }) {
  if (submissions.length === 0) return null;
  return (
    <ul aria-label="Linked submissions" className="mt-3 flex flex-wrap gap-2">
      {submissions.map((s) => (
        <li key={s.id}>
          <Link
            to={s.url}
            className="flex flex-wrap items-baseline gap-x-2 rounded-lg border border-paper-line bg-paper px-3 py-1.5 text-caption hover:border-fjord-300"
          >
            <span className="font-semibold text-fjord-700">#{s.id}</span>
            <span className="text-ink-soft">
              fw {s.firmware} as {s.side.toUpperCase()}
            </span>
            <span className="font-semibold tabular-nums text-ink" title="A relative to B">
              A vs B {signedPercent(s.biasPercent)}
            </span>
            {s.loaLowerPercent !== null && s.loaUpperPercent !== null && (
              <span className="tabular-nums text-ink-soft">
                limits {signedPercent(s.loaLowerPercent)} to {signedPercent(s.loaUpperPercent)}
              </span>
            )}
            {s.powerDropouts !== null && (
              <span className="tabular-nums text-ink-soft">
                {s.powerDropouts} power {s.powerDropouts === 1 ? 'dropout' : 'dropouts'}
              </span>
            )}
          </Link>
        </li>
      ))}
    </ul>
  );
}
