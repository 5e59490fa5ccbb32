import type { ReactNode } from 'react';
import { NavLink } from 'react-router-dom';

export interface SectionLink {
  to: string;
  label: string;
  end?: boolean;
}

/** The frame of a back-office page: the section's name, a title, a line of purpose, and the way to its sibling pages. */
export function SectionPage({
  section,
  links,
  title,
  intro,
  children,
}: {
  section: string;
  links: SectionLink[];
  title: string;
  intro: string;
  children: ReactNode;
}) {
  return (
    <div className="space-y-6">
      <header className="space-y-3">
        <div>
          <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">{section}</p>
          <h1 className="text-title font-semibold">{title}</h1>
          <p className="max-w-2xl text-ink-soft">{intro}</p>
        </div>
        <nav aria-label={`${section} pages`} className="flex flex-wrap gap-1 border-b border-paper-line pb-2">
          {links.map((link) => (
            <NavLink
              key={link.to}
              to={link.to}
              end={link.end}
              className={({ isActive }) =>
                `rounded-full px-3 py-1 text-caption font-medium ${isActive ? 'bg-ember-100 text-ember-900' : 'text-ink-soft hover:bg-paper-deep hover:text-ink'}`
              }
            >
              {link.label}
            </NavLink>
          ))}
        </nav>
      </header>
      {children}
    </div>
  );
}
