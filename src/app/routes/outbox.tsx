import { AdminPage } from '@/features/admin/components/admin-page';
import { OutboxList } from '@/features/outbox/components/outbox-list';

export function OutboxRoute() {
  return (
    <AdminPage
      title="Outbox"
      intro="Every e-mail the local mail service captured, with its full text. In production, mail goes to the real SMTP host instead."
    >
      <OutboxList />
    </AdminPage>
  );
}
