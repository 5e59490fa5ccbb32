import { Link, useParams } from 'react-router-dom';
import { ApiError } from '@/lib/api-client';
import { DecisionNotice } from '@/features/moderation/components/decision-notice';
import { useSubmission } from '@/features/submissions/api/get-submission';
import { RecordingSummary } from '@/features/submissions/components/recording-summary';
import { SafetyNote } from '@/features/submissions/components/safety-note';
import { SubmissionProgress } from '@/features/submissions/components/submission-progress';
import { SubmissionResult } from '@/features/submissions/components/submission-result';
import { formatDay } from '@/lib/format-date';
import { SURFACE_LABELS } from '@shared/schemas/submission';

export function SubmissionRoute() {
  const id = Number(useParams().id);
  const submission = useSubmission(id);

  if (submission.isPending) return <p className="text-ink-soft">Loading the submission…</p>;
  if (submission.isError) {
    const notFound = submission.error instanceof ApiError && submission.error.status === 404;
    return (
      <div className="max-w-xl space-y-3 py-6">
        <h1 className="text-title font-semibold">{notFound ? 'No such submission' : 'This submission could not be loaded'}</h1>
        <p className="text-ink-soft">
          {notFound ? 'It does not exist, or it is not public yet. If it is yours, sign in to see it.' : submission.error.message}
        </p>
        <Link to="/" className="font-semibold text-fjord-700 underline underline-offset-2">
          Back to the overview
        </Link>
      </div>
    );
  }

  const s = submission.data;
  return (
    <div className="space-y-8">
      <header className="space-y-2">
        <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Submission #{s.id}</p>
        <h1 className="text-title font-semibold text-ink sm:text-display">
          {s.recordings.find((r) => r.side === 'a')?.modelName ?? 'A'} <span className="text-ink-faint">against</span>{' '}
          {s.recordings.find((r) => r.side === 'b')?.modelName ?? 'B'}
        </h1>
        <p className="text-ink-soft">
          {s.isOwn ? 'Your ride' : `Ridden by ${s.rider.name}`}, {s.indoor ? 'indoors' : 'outdoors'} on{' '}
          {SURFACE_LABELS[s.surface].toLowerCase()} · sent {formatDay(s.submittedOn)}
        </p>
        {s.notes && <p className="max-w-3xl whitespace-pre-line rounded-lg bg-paper-deep p-3 text-caption text-ink-soft">“{s.notes}”</p>}
      </header>
      <SubmissionProgress status={s.status} errorMessage={s.errorMessage} />
      <DecisionNotice submissionId={s.id} status={s.status} isOwn={s.isOwn} recordings={s.recordings} />
      <RecordingSummary recordings={s.recordings} />
      {s.result && <SafetyNote />}
      {s.result && (
        <SubmissionResult
          submissionId={s.id}
          result={s.result}
          names={{
            a: s.recordings.find((r) => r.side === 'a')?.modelName ?? 'A',
            b: s.recordings.find((r) => r.side === 'b')?.modelName ?? 'B',
          }}
        />
      )}
      {s.isOwn && (
        <Link to="/my-submissions" className="inline-block font-semibold text-fjord-700 underline underline-offset-2">
          All your submissions
        </Link>
      )}
    </div>
  );
}
