import type { SubmissionStatus } from '@shared/schemas/submission';
import { STATUS_LABELS } from '../lib/labels';

const STEPS: Array<{ key: string; label: string; reached: SubmissionStatus[] }> = [
  {
    key: 'received',
    label: 'Received',
    reached: ['received', 'analysing', 'awaiting_review', 'sent_back', 'accepted', 'rejected', 'withdrawn', 'failed'],
  },
  { key: 'analysing', label: 'Analysed', reached: ['awaiting_review', 'sent_back', 'accepted', 'rejected'] },
  { key: 'review', label: 'Reviewed by a moderator', reached: ['accepted', 'rejected', 'sent_back'] },
];

const EXPLANATION: Record<SubmissionStatus, string> = {
  received: 'Your files are safely stored and waiting for the analysis to start. This page updates by itself.',
  analysing: 'The analysis is running: aligning the clocks, finding dropouts and measuring the bias. This page updates by itself.',
  awaiting_review: 'The analysis is done. A moderator will look at it before it counts towards the figures for these models.',
  sent_back: 'A moderator sent this back to you with a question.',
  accepted: 'Accepted: this comparison counts towards the figures for both models.',
  rejected: 'A moderator decided this comparison should not count.',
  withdrawn: 'You withdrew this submission.',
  failed: 'The analysis could not use these recordings.',
};

/** Where a submission stands, announced to screen readers as it changes. */
export function SubmissionProgress({ status, errorMessage }: { status: SubmissionStatus; errorMessage: string | null }) {
  const working = status === 'received' || status === 'analysing';
  return (
    <section aria-labelledby="progress-title" className="rounded-card border border-paper-line bg-white p-5 shadow-card sm:p-6">
      <div className="flex flex-wrap items-center gap-3">
        <h2 id="progress-title" className="text-lead font-semibold">
          Status
        </h2>
        <p role="status" aria-live="polite" className="flex items-center gap-2">
          {working && (
            <span aria-hidden="true" className="h-3.5 w-3.5 animate-spin rounded-full border-2 border-fjord-300 border-t-fjord-700" />
          )}
          <span
            data-testid="submission-status"
            className={`rounded-full px-3 py-0.5 text-caption font-semibold ${
              status === 'failed' || status === 'rejected'
                ? 'bg-alert-100 text-alert-800'
                : status === 'accepted'
                  ? 'bg-moss-100 text-moss-700'
                  : 'bg-fjord-100 text-fjord-900'
            }`}
          >
            {STATUS_LABELS[status]}
          </span>
        </p>
      </div>
      <ol className="mt-4 grid gap-2 sm:grid-cols-3">
        {STEPS.map((step, index) => {
          const done = step.reached.includes(status);
          const current = !done && (index === 0 || STEPS[index - 1]!.reached.includes(status)) && status !== 'failed';
          return (
            <li key={step.key} className="flex items-center gap-2.5 text-caption">
              <span
                aria-hidden="true"
                className={`grid h-6 w-6 shrink-0 place-items-center rounded-full text-[0.6875rem] font-bold ${
                  done
                    ? 'bg-fjord-700 text-paper'
                    : current
                      ? 'border-2 border-fjord-700 text-fjord-700'
                      : 'border border-paper-line text-ink-faint'
                }`}
              >
                {done ? '✓' : index + 1}
              </span>
              <span className={done || current ? 'font-medium text-ink' : 'text-ink-soft'}>
                {step.label}
                <span className="sr-only">{done ? ': done' : current ? ': in progress' : ': not yet'}</span>
              </span>
            </li>
          );
        })}
      </ol>
      <p className="mt-4 text-ink-soft">{EXPLANATION[status]}</p>
      {status === 'failed' && errorMessage && <p className="mt-2 rounded-lg bg-alert-100 p-3 font-medium text-alert-800">{errorMessage}</p>}
    </section>
  );
}
