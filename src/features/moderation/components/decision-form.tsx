import { useState } from 'react';
import { type Decision, REJECT_REASON_LABELS, REJECT_REASONS, type RejectReason } from '@shared/schemas/moderation';
import { ApiError } from '@/lib/api-client';
import { useDecideSubmission } from '../api/decide-submission';

const CHOICES: Record<Decision, { label: string; hint: string }> = {
  accept: { label: 'Accept', hint: 'It counts in the statistics of both meters.' },
  reject: { label: 'Reject', hint: 'It does not count; the rider is told why.' },
  send_back: { label: 'Send back', hint: 'The rider corrects the tags and it returns here.' },
  withdraw: { label: 'Withdraw', hint: 'It leaves the statistics again.' },
};

/** The moderator's decision, carrying the version they looked at so a parallel decision is a clear conflict. */
export function DecisionForm({
  submissionId,
  status,
  version,
  suggestedReason,
}: {
  submissionId: number;
  status: string;
  version: number;
  suggestedReason?: RejectReason | null;
}) {
  const decide = useDecideSubmission(submissionId);
  const available: Decision[] =
    status === 'awaiting_review'
      ? ['accept', 'reject', 'send_back']
      : status === 'accepted'
        ? ['withdraw']
        : status === 'sent_back'
          ? ['reject']
          : [];
  const [picked, setDecision] = useState<Decision | undefined>(undefined);
  // After a decision the choices change (an accepted one can only be withdrawn): forget a choice that no longer applies.
  const decision = picked && available.includes(picked) ? picked : available.length === 1 ? available[0] : undefined;
  const [reason, setReason] = useState<string>(suggestedReason ?? '');
  const [note, setNote] = useState('');

  const done = decide.isSuccess && (
    <p role="status" className="rounded-lg bg-moss-100 p-3 font-medium text-moss-700">
      Done: the submission is now {decide.data.status.replace(/_/g, ' ')}, and the rider has been told.
    </p>
  );
  if (available.length === 0) {
    return (
      <div className="space-y-3">
        {done}
        <p className="text-ink-soft">There is nothing to decide on a submission that is {status.replace(/_/g, ' ')}.</p>
      </div>
    );
  }
  const fields = decide.error instanceof ApiError ? (decide.error.details?.fields ?? {}) : {};

  function submit(event: React.FormEvent) {
    event.preventDefault();
    if (!decision) return;
    const expectedVersion = version;
    if (decision === 'accept') decide.mutate({ decision, note: note || undefined, expectedVersion });
    else if (decision === 'reject') decide.mutate({ decision, reason: reason as RejectReason, note: note || undefined, expectedVersion });
    else if (decision === 'send_back') decide.mutate({ decision, note, expectedVersion });
    else decide.mutate({ decision, reason: note, expectedVersion });
  }

  return (
    <form
      onSubmit={submit}
      className="space-y-4 rounded-card border border-fjord-300 bg-fjord-50 p-5 shadow-card"
      aria-labelledby="decision-title"
    >
      <h2 id="decision-title" className="text-lead font-semibold">
        Your decision
      </h2>
      <fieldset className="flex flex-wrap gap-3">
        <legend className="sr-only">Decision</legend>
        {available.map((choice) => (
          <label
            key={choice}
            className={`flex cursor-pointer flex-col rounded-lg border px-4 py-2.5 ${decision === choice ? 'border-fjord-700 bg-white' : 'border-paper-line bg-paper'}`}
          >
            <span className="flex items-center gap-2 font-semibold">
              <input type="radio" name="decision" value={choice} checked={decision === choice} onChange={() => setDecision(choice)} />
              {CHOICES[choice].label}
            </span>
            <span className="text-caption text-ink-soft">{CHOICES[choice].hint}</span>
          </label>
        ))}
      </fieldset>
      {decision === 'reject' && (
        <label className="flex flex-col gap-1 font-medium">
          Reason
          <select
            required
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            className="rounded-lg border border-paper-line bg-white px-3 py-2"
            aria-invalid={!!fields.reason}
          >
            <option value="">Choose a reason…</option>
            {REJECT_REASONS.map((r) => (
              <option key={r} value={r}>
                {REJECT_REASON_LABELS[r]}
              </option>
            ))}
          </select>
          {fields.reason && <span className="text-caption text-alert-800">{fields.reason}</span>}
        </label>
      )}
      {decision && (
        <label className="flex flex-col gap-1 font-medium">
          {decision === 'send_back'
            ? 'What should the rider correct?'
            : decision === 'withdraw'
              ? 'Why does it leave the statistics?'
              : 'Note to the rider (optional)'}
          <textarea
            value={note}
            onChange={(e) => setNote(e.target.value)}
            rows={3}
            maxLength={1000}
            required={decision === 'send_back' || decision === 'withdraw' || reason === 'other'}
            className="rounded-lg border border-paper-line bg-white px-3 py-2 font-normal"
            aria-invalid={!!(fields.note || fields.reason)}
          />
          {(fields.note || (decision === 'withdraw' && fields.reason)) && (
            <span className="text-caption text-alert-800">{fields.note ?? fields.reason}</span>
          )}
        </label>
      )}
      {decide.isError && (
        <p role="alert" className="rounded-lg bg-alert-100 p-3 font-medium text-alert-800">
          {decide.error.message}
        </p>
      )}
      {done}
      <button
        type="submit"
        disabled={!decision || decide.isPending}
        className="rounded-full bg-fjord-700 px-5 py-2 font-semibold text-paper hover:bg-fjord-900 disabled:opacity-50"
      >
        {decide.isPending ? 'Saving…' : 'Record the decision'}
      </button>
    </form>
  );
}
