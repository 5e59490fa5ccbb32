import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { RequireAccess } from '@/features/auth/components/require-access';

/** The frame of every admin page: admins only, a title, a line of purpose, a link to the sibling page. */
export function AdminPage({ title, intro, link, children }: { title: string; intro: string; link: { to: string; label: string }; children: ReactNode }) {
  return (
    <RequireAccess roles={['admin']}>
      {() => (
        <div className="space-y-6">
          <header className="flex flex-wrap items-end justify-between gap-3">
            <div>
              <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Admin</p>
              <h1 className="text-title font-semibold">{title}</h1>
              <p className="text-ink-soft">{intro}</p>
            </div>
            <Link to={link.to} className="text-fjord-700 underline underline-offset-4 hover:text-fjord-900">
              {link.label}
            </Link>
          </header>
          {children}
        </div>
      )}
    </RequireAccess>
  );
}
