import { AdminPage } from '@/features/admin/components/admin-page';
import { AuditLogTable } from '@/features/admin/components/audit-log-table';

export function AdminAuditLogRoute() {
  return (
    <AdminPage title="Audit log" intro="Every change to roles, memberships and decisions, with who made it.">
      <AuditLogTable />
    </AdminPage>
  );
}
