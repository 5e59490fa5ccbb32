import { THREAD_STATUS_LABELS, type FirmwareRef, type ThreadStatus } from '@shared/schemas/threads';

const STYLES: Record<ThreadStatus, string> = {
  open: 'bg-paper-deep text-ink-soft border-paper-line',
  acknowledged: 'bg-caution-100 text-caution-600 border-caution-600/30',
  investigating: 'bg-ember-50 text-ember-700 border-ember-300',
  fixed: 'bg-moss-100 text-moss-700 border-moss-500/40',
};

export function ThreadStatusBadge({ status, fixedIn }: { status: ThreadStatus; fixedIn: FirmwareRef | null }) {
  return (
    <span
      className={`inline-flex items-center rounded-full border px-2.5 py-0.5 text-caption font-semibold ${STYLES[status]}`}
      data-testid="thread-status"
    >
      {status === 'fixed' && fixedIn ? `Fixed in firmware ${fixedIn.version}` : THREAD_STATUS_LABELS[status]}
    </span>
  );
}
