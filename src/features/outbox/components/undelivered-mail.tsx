import type { UndeliveredMail } from '@shared/schemas/mail';
import { formatDayAndTime } from '@/lib/format-date';
import { useUndeliveredMail } from '../api/get-undelivered-mail';
import { useResendMail } from '../api/resend-mail';

/** Mail that has not reached the mail service: retried on its own, or given up and waiting for an admin. */
export function UndeliveredMailList() {
  const undelivered = useUndeliveredMail();
  if (undelivered.isPending)
    return (
      <p className="text-ink-soft" role="status">
        Loading undelivered mail…
      </p>
    );
  if (undelivered.isError)
    return (
      <p className="text-alert-800" role="alert">
        Undelivered mail could not be loaded: {undelivered.error.message}
      </p>
    );
  const { messages } = undelivered.data;
  return (
    <section aria-labelledby="undelivered-heading" className="space-y-3">
      <h2 id="undelivered-heading" className="text-lg font-semibold text-ink">
        Not delivered
      </h2>
      {messages.length === 0 ? (
        <p className="text-caption text-ink-soft">Every message has reached the mail service.</p>
      ) : (
        <ul className="space-y-3">
          {messages.map((m) => (
            <UndeliveredMessage key={m.id} message={m} />
          ))}
        </ul>
      )}
    </section>
  );
}

function UndeliveredMessage({ message: m }: { message: UndeliveredMail }) {
  const resend = useResendMail();
  const failed = m.status === 'failed';
  return (
    <li className="rounded-card border border-paper-line bg-white p-4 shadow-card" data-testid="undelivered-message">
      <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <span className="font-semibold text-ink">{m.subject}</span>
        <span className="text-caption text-ink-soft">to {m.to}</span>
        <span
          className={`ml-auto rounded-full px-2.5 py-0.5 text-caption ${failed ? 'bg-alert-100 text-alert-800' : 'bg-paper text-ink-soft'}`}
        >
          {failed ? 'Given up' : `Retrying, next ${formatDayAndTime(m.nextAttemptAt)}`}
        </span>
      </div>
      <p className="mt-2 text-caption text-ink-soft">
        {m.attempts} {m.attempts === 1 ? 'attempt' : 'attempts'} since {formatDayAndTime(m.createdAt)}. Last error:{' '}
        <code className="break-all">{m.lastError ?? 'none'}</code>
      </p>
      {failed && (
        <div className="mt-3 flex flex-wrap items-center gap-3">
          <button
            type="button"
            disabled={resend.isPending || resend.isSuccess}
            onClick={() => resend.mutate(m.id)}
            className="rounded-full bg-fjord-700 px-4 py-1.5 font-medium text-paper hover:bg-fjord-900 disabled:opacity-50"
          >
            {resend.isSuccess ? 'Queued again' : 'Send again'}
          </button>
          {resend.isError && (
            <span className="text-caption text-alert-800" role="alert">
              {resend.error.message}
            </span>
          )}
        </div>
      )}
    </li>
  );
}
