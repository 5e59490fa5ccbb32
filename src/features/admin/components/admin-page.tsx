import type { ReactNode } from 'react';
import { NavLink } from 'react-router-dom';
import { RequireAccess } from '@/features/auth/components/require-access';

const adminPages = [
  { to: '/admin/users', label: 'People and roles' },
  { to: '/admin/audit-log', label: 'Audit log' },
  { to: '/admin/outbox', label: 'Outbox' },
];

/** The frame of every admin page: admins only, a title, a line of purpose, and the way to the other admin pages. */
export function AdminPage({ title, intro, children }: { title: string; intro: string; children: ReactNode }) {
  return (
    <RequireAccess roles={['admin']}>
      {() => (
        <div className="space-y-6">
          <header className="space-y-3">
            <div>
              <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Admin</p>
              <h1 className="text-title font-semibold">{title}</h1>
              <p className="text-ink-soft">{intro}</p>
            </div>
            <nav aria-label="Admin pages" className="flex flex-wrap gap-1 border-b border-paper-line pb-2">
              {adminPages.map((page) => (
                <NavLink
                  key={page.to}
                  to={page.to}
                  className={({ isActive }) =>
                    `rounded-full px-3 py-1 text-caption font-medium ${isActive ? 'bg-ember-100 text-ember-900' : 'text-ink-soft hover:bg-paper-deep hover:text-ink'}`
                  }
                >
                  {page.label}
                </NavLink>
              ))}
            </nav>
          </header>
          {children}
        </div>
      )}
    </RequireAccess>
  );
}
