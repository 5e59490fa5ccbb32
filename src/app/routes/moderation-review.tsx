import { Link, useParams } from 'react-router-dom';
import type { Submission } from '@/features/submissions/api/get-submission';
import { RecordingSummary } from '@/features/submissions/components/recording-summary';
import { ResultHeadline } from '@/features/submissions/components/result-headline';
import { formatDay } from '@/lib/format-date';
import { STATUS_LABELS } from '@/features/submissions/lib/labels';
import { RequireAccess } from '@/features/auth/components/require-access';
import { useReview } from '@/features/moderation/api/get-review';
import { DecisionForm } from '@/features/moderation/components/decision-form';
import { ReviewEvidence } from '@/features/moderation/components/review-evidence';

export function ModerationReviewRoute() {
  const id = Number(useParams().id);
  return <RequireAccess roles={['moderator']}>{() => <ReviewPage id={id} />}</RequireAccess>;
}

function ReviewPage({ id }: { id: number }) {
  const review = useReview(id);
  if (review.isPending)
    return (
      <p className="text-ink-soft" role="status">
        Loading the submission…
      </p>
    );
  if (review.isError)
    return (
      <p className="text-alert-800" role="alert">
        This submission could not be loaded: {review.error.message}
      </p>
    );
  const data = review.data;
  const s = data.submission as unknown as Submission & { version: number };
  const a = s.recordings.find((r) => r.side === 'a');
  const b = s.recordings.find((r) => r.side === 'b');
  const suggested = data.flags.find((f) => f.likelyReason)?.likelyReason ?? null;
  return (
    <div className="space-y-8">
      <header className="space-y-2">
        <Link to="/moderation" className="text-caption font-semibold text-fjord-700 underline underline-offset-2">
          ← Review queue
        </Link>
        <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">
          Submission #{s.id} · {STATUS_LABELS[s.status]}
        </p>
        <h1 className="text-title font-semibold text-ink">
          {a?.modelName ?? 'A'} {a?.firmwareVersion} <span className="text-ink-faint">against</span> {b?.modelName ?? 'B'}{' '}
          {b?.firmwareVersion}
        </h1>
        <p className="text-ink-soft">
          By {s.rider.name}
          {s.rider.handle ? ` (@${s.rider.handle})` : ''}, {s.indoor ? 'indoors' : 'outdoors'} · sent {formatDay(s.submittedOn)}
        </p>
        {s.notes && <p className="max-w-3xl whitespace-pre-line rounded-lg bg-paper-deep p-3 text-caption text-ink-soft">“{s.notes}”</p>}
      </header>
      <div className="grid gap-8 lg:grid-cols-[1fr_22rem]">
        <div className="space-y-8">
          {s.result && <ResultHeadline result={s.result} />}
          <ReviewEvidence review={data} />
          <RecordingSummary recordings={s.recordings} />
        </div>
        <aside className="space-y-4 lg:sticky lg:top-6 lg:self-start">
          <DecisionForm submissionId={s.id} status={s.status} version={s.version} suggestedReason={suggested} />
          {data.decision && (
            <p className="text-caption text-ink-soft">
              Last decision {formatDay(data.decision.decidedOn)}
              {data.decision.reasonLabel ? `: ${data.decision.reasonLabel}` : ''}
              {data.decision.note ? ` — “${data.decision.note}”` : ''}
            </p>
          )}
        </aside>
      </div>
    </div>
  );
}
