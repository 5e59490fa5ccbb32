import { useState } from 'react';
import type { SubmissionStatus } from '@shared/schemas/submission';
import { ApiError } from '@/lib/api-client';
import { useFirmwareChoices } from '../api/get-firmware-choices';
import { useSubmissionDecision } from '../api/get-submission-decision';
import { useResubmitTags } from '../api/resubmit-tags';

interface TaggedRecording {
  side: 'a' | 'b';
  modelName: string;
  firmwareVersion: string;
  /** Sent by the API with every recording (not all client types name it). */
  modelId?: number;
}

/**
 * On a submission's page: why a moderator rejected, sent back or withdrew it, in
 * plain text; for a rider whose submission was sent back, the form to correct the
 * firmware tags, after which it returns to the review queue.
 */
export function DecisionNotice({
  submissionId,
  status,
  isOwn,
  recordings,
}: {
  submissionId: number;
  status: SubmissionStatus;
  isOwn: boolean;
  recordings: TaggedRecording[];
}) {
  const shown = status === 'rejected' || status === 'sent_back' || status === 'withdrawn';
  const decision = useSubmissionDecision(submissionId, status);
  if (!shown || !decision.data?.decision) return null;
  const { reasonLabel, note } = decision.data.decision;
  const title =
    status === 'rejected'
      ? 'Why it was not accepted'
      : status === 'sent_back'
        ? 'A moderator asks for a correction'
        : 'Why it was withdrawn';
  return (
    <section
      aria-labelledby="decision-notice-title"
      data-testid="decision-notice"
      className="space-y-3 rounded-card border border-alert-600/30 bg-alert-100/60 p-5 sm:p-6"
    >
      <h2 id="decision-notice-title" className="text-lead font-semibold text-alert-800">
        {title}
      </h2>
      {status === 'rejected' && reasonLabel && <p className="font-semibold">{reasonLabel}</p>}
      {status === 'withdrawn' && decision.data.decision.reason && <p className="whitespace-pre-line">{decision.data.decision.reason}</p>}
      {note && <p className="whitespace-pre-line rounded-lg bg-white/70 p-3 text-ink-soft">“{note}”</p>}
      {status === 'sent_back' && isOwn && (
        <CorrectTagsForm submissionId={submissionId} version={decision.data.version} recordings={recordings} />
      )}
    </section>
  );
}

function CorrectTagsForm({ submissionId, version, recordings }: { submissionId: number; version: number; recordings: TaggedRecording[] }) {
  const firmware = useFirmwareChoices(true);
  const resubmit = useResubmitTags(submissionId);
  const [choices, setChoices] = useState<Record<string, number | undefined>>({});

  function submit(event: React.FormEvent) {
    event.preventDefault();
    const change = (side: 'a' | 'b') => (choices[side] ? { firmwareId: choices[side] } : undefined);
    resubmit.mutate({ a: change('a'), b: change('b'), expectedVersion: version });
  }

  return (
    <form onSubmit={submit} className="space-y-3">
      {recordings.map((r) => {
        const options = (firmware.data ?? []).filter((f) => f.modelId === r.modelId);
        return (
          <label key={r.side} className="flex flex-col gap-1 font-medium">
            Firmware of {r.side.toUpperCase()}, {r.modelName} (now {r.firmwareVersion})
            <select
              className="rounded-lg border border-paper-line bg-white px-3 py-2"
              value={choices[r.side] ?? ''}
              onChange={(e) => setChoices({ ...choices, [r.side]: e.target.value ? Number(e.target.value) : undefined })}
            >
              <option value="">Keep {r.firmwareVersion}</option>
              {options.map((f) => (
                <option key={f.id} value={f.id}>
                  {f.version}
                </option>
              ))}
            </select>
          </label>
        );
      })}
      {resubmit.isError && (
        <p role="alert" className="font-medium text-alert-800">
          {resubmit.error instanceof ApiError ? resubmit.error.message : 'The correction could not be saved.'}
        </p>
      )}
      <button
        type="submit"
        disabled={resubmit.isPending}
        className="rounded-full bg-fjord-700 px-5 py-2 font-semibold text-paper hover:bg-fjord-900 disabled:opacity-50"
      >
        Send the corrected tags for review
      </button>
    </form>
  );
}
