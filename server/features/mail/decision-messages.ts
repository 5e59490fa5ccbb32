import { REJECT_REASON_LABELS, type RejectReason } from '@shared/schemas/moderation';
import type { MailKind } from './mail.service';

export interface DecisionMailFacts {
  submissionId: number;
  riderName: string;
  /** "Orbit 2.1.0 against Treadle 4.0.2" */
  comparison: string;
  submissionUrl: string;
  reason?: string | null;
  note?: string | null;
}

/** The texts of the e-mails a rider gets about a moderator's decision. Plain text only. */
export function decisionMail(kind: Extract<MailKind, `submission_${string}`>, facts: DecisionMailFacts): { subject: string; text: string } {
  const hello = `Hello ${facts.riderName},`;
  const note = facts.note ? `\nThe moderator's note:\n${facts.note}\n` : '';
  switch (kind) {
    case 'submission_accepted':
      return {
        subject: `Your submission #${facts.submissionId} was accepted`,
        text: `${hello}\n\nyour comparison of ${facts.comparison} was accepted and now counts in the statistics. Thank you for measuring.\n${note}\nSee it here: ${facts.submissionUrl}`,
      };
    case 'submission_rejected': {
      const label = REJECT_REASON_LABELS[facts.reason as RejectReason] ?? facts.reason ?? 'no reason given';
      return {
        subject: `Your submission #${facts.submissionId} was not accepted`,
        text: `${hello}\n\nyour comparison of ${facts.comparison} was not accepted.\n\nReason: ${label}\n${note}\nSee it here: ${facts.submissionUrl}`,
      };
    }
    case 'submission_sent_back':
      return {
        subject: `Please correct the tags of submission #${facts.submissionId}`,
        text: `${hello}\n\na moderator sent your comparison of ${facts.comparison} back for a correction before it can count.\n${note}\nCorrect the tags here and it returns to the queue: ${facts.submissionUrl}`,
      };
  }
}
