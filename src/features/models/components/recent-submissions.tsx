import { Link } from 'react-router-dom';
import type { RecentSubmission } from '@shared/schemas/statistics';
import { hours, signedPercent } from '@/lib/format-figures';

export function RecentSubmissions({ submissions }: { submissions: RecentSubmission[] }) {
  if (submissions.length === 0) return <p className="text-ink-soft">No accepted rides yet.</p>;
  return (
    <ul className="divide-y divide-paper-line rounded-card border border-paper-line bg-white shadow-card">
      {submissions.map((s) => (
        <li key={`${s.id}:${s.side}`} className="flex flex-wrap items-baseline justify-between gap-2 px-4 py-3">
          <Link to={`/submissions/${s.id}`} className="font-medium text-fjord-700 hover:underline">
            Ride {s.id} · {s.rideMonth}
          </Link>
          <span className="text-caption text-ink-soft">
            fw {s.firmware} against {s.partner.makerName} {s.partner.modelName} (fw {s.partner.firmware})
          </span>
          <span className="tabular-nums text-caption text-ink">
            {s.biasPercent === null ? 'no bias' : signedPercent(s.biasPercent)} · {hours(s.pedallingHours)} · {s.powerDropouts} dropouts
          </span>
        </li>
      ))}
    </ul>
  );
}
