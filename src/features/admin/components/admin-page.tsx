import type { ReactNode } from 'react';
import { SectionPage } from '@/components/ui/section-page';
import { RequireAccess } from '@/features/auth/components/require-access';

const adminPages = [
  { to: '/admin/users', label: 'People and roles' },
  { to: '/admin/audit-log', label: 'Audit log' },
  { to: '/admin/reanalysis', label: 'Re-analysis' },
  { to: '/admin/outbox', label: 'Outbox' },
];

/** Every admin page: admins only, in the admin section's frame. */
export function AdminPage({ title, intro, children }: { title: string; intro: string; children: ReactNode }) {
  return (
    <RequireAccess roles={['admin']}>
      {() => (
        <SectionPage section="Admin" links={adminPages} title={title} intro={intro}>
          {children}
        </SectionPage>
      )}
    </RequireAccess>
  );
}
