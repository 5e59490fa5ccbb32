import type { FlagSeverity, QualityFlag } from '@shared/analysis/types';
import { SEVERITY_LABELS } from '../lib/labels';

const SEVERITY_STYLE: Record<FlagSeverity, string> = {
  info: 'border-fjord-100 bg-white text-ink',
  warning: 'border-caution-600/40 bg-caution-100 text-ink',
  severe: 'border-alert-600/40 bg-alert-100 text-alert-800',
};
const BADGE_STYLE: Record<FlagSeverity, string> = {
  info: 'bg-fjord-700 text-paper',
  warning: 'bg-caution-600 text-white',
  severe: 'bg-alert-600 text-white',
};

/** The engine's quality flags, worst first, in the words the engine wrote for riders. */
export function FlagList({ flags, compact }: { flags: QualityFlag[]; compact?: boolean }) {
  const order: FlagSeverity[] = ['severe', 'warning', 'info'];
  const sorted = [...flags].sort((x, y) => order.indexOf(x.severity) - order.indexOf(y.severity));
  return (
    <ul className={compact ? 'space-y-2' : 'space-y-3'}>
      {sorted.map((flag) => (
        <li
          key={`${flag.code}:${flag.message}`}
          className={`flex items-start gap-3 rounded-lg border p-3 text-caption ${SEVERITY_STYLE[flag.severity]}`}
        >
          <span
            className={`shrink-0 rounded-full px-2 py-0.5 text-[0.6875rem] font-bold uppercase tracking-wide ${BADGE_STYLE[flag.severity]}`}
          >
            {SEVERITY_LABELS[flag.severity]}
          </span>
          <span>{flag.message}</span>
        </li>
      ))}
    </ul>
  );
}
