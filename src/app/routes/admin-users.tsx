import { AdminPage } from '@/features/admin/components/admin-page';
import { ObjectStoreLine } from '@/features/admin/components/object-store-line';
import { UsersTable } from '@/features/admin/components/users-table';

export function AdminUsersRoute() {
  return (
    <AdminPage
      title="People and roles"
      intro="Make people moderators or admins, and verify makers’ staff. Every change goes into the audit log."
    >
      <div className="space-y-6">
        <ObjectStoreLine />
        <UsersTable />
      </div>
    </AdminPage>
  );
}
