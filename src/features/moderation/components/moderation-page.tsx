import type { ReactNode } from 'react';
import { NavLink } from 'react-router-dom';
import { RequireAccess } from '@/features/auth/components/require-access';

const moderationPages = [
  { to: '/moderation', label: 'Review queue', end: true },
  { to: '/moderation/catalogue', label: 'Catalogue', end: false },
];

/** The frame of the moderators' list pages: moderators only, a title, a line of purpose, the way to the other page. */
export function ModerationPage({ title, intro, children }: { title: string; intro: string; children: ReactNode }) {
  return (
    <RequireAccess roles={['moderator']}>
      {() => (
        <div className="space-y-6">
          <header className="space-y-3">
            <div>
              <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Moderation</p>
              <h1 className="text-title font-semibold">{title}</h1>
              <p className="max-w-2xl text-ink-soft">{intro}</p>
            </div>
            <nav aria-label="Moderation pages" className="flex flex-wrap gap-1 border-b border-paper-line pb-2">
              {moderationPages.map((page) => (
                <NavLink
                  key={page.to}
                  to={page.to}
                  end={page.end}
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
