import { AdminPage } from '@/features/admin/components/admin-page';
import { OutboxList } from '@/features/outbox/components/outbox-list';
import { UndeliveredMailList } from '@/features/outbox/components/undelivered-mail';

export function OutboxRoute() {
  return (
    <AdminPage
      title="Outbox"
      intro="Mail that has not reached the mail service yet, and every e-mail the local mail service captured, with its full text. In production, mail goes to the real SMTP host instead."
    >
      <div className="space-y-10">
        <UndeliveredMailList />
        <section aria-labelledby="captured-heading" className="space-y-3">
          <h2 id="captured-heading" className="text-lg font-semibold text-ink">
            Captured by the local mail service
          </h2>
          <OutboxList />
        </section>
      </div>
    </AdminPage>
  );
}
