import { AdminPage } from '@/features/admin/components/admin-page';
import { UsersTable } from '@/features/admin/components/users-table';

export function AdminUsersRoute() {
  return (
    <AdminPage
      title="People and roles"
      intro="Make people moderators or admins, and verify makers’ staff. Every change goes into the audit log."
    >
      <UsersTable />
    </AdminPage>
  );
}
