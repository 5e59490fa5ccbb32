import { signedPercent } from '@/lib/format-figures';
import { Link } from 'react-router-dom';
import { useMySubmissions } from '../api/get-my-submissions';
import { formatDay } from '@/lib/format-date';

import { STATUS_LABELS } from '../lib/labels';

/** The rider's own submissions, newest first, each linking to its result. */
export function MySubmissionsList() {
  const mine = useMySubmissions();
  if (mine.isPending) return <p className="text-ink-soft">Loading your submissions…</p>;
  if (mine.isError) return <p className="text-alert-800">Your submissions could not be loaded: {mine.error.message}</p>;
  if (mine.data.submissions.length === 0) {
    return (
      <div className="rounded-card border border-dashed border-paper-line p-6 text-ink-soft">
        <p>You have not sent a ride yet.</p>
        <Link to="/submit" className="mt-2 inline-block font-semibold text-fjord-700 underline underline-offset-2">
          Submit your first ride
        </Link>
      </div>
    );
  }
  return (
    <ul className="divide-y divide-paper-line overflow-hidden rounded-card border border-paper-line bg-white shadow-card">
      {mine.data.submissions.map((s) => {
        const a = s.recordings.find((r) => r.side === 'a');
        const b = s.recordings.find((r) => r.side === 'b');
        const problems = s.flags.filter((f) => f.severity !== 'info').length;
        return (
          <li key={s.id}>
            <Link to={`/submissions/${s.id}`} className="flex flex-wrap items-center gap-x-5 gap-y-1 px-5 py-4 hover:bg-paper">
              <span className="w-full min-w-0 sm:w-auto sm:flex-1">
                <span className="block font-semibold text-ink">
                  <span className="text-ember-700">{a ? `${a.model} ${a.firmware}` : 'A'}</span>
                  <span className="text-ink-soft"> vs </span>
                  <span className="text-moss-700">{b ? `${b.model} ${b.firmware}` : 'B'}</span>
                </span>
                <span className="text-caption text-ink-soft">
                  #{s.id} · sent {formatDay(s.submittedOn)}
                  {problems > 0 && ` · ${problems} ${problems === 1 ? 'check' : 'checks'} flagged`}
                </span>
              </span>
              <span className="text-lead font-semibold tabular-nums text-ink">{signedPercent(s.biasPercent)}</span>
              <span className="rounded-full bg-fjord-100 px-3 py-0.5 text-caption font-semibold text-fjord-900">
                {STATUS_LABELS[s.status]}
              </span>
            </Link>
          </li>
        );
      })}
    </ul>
  );
}
