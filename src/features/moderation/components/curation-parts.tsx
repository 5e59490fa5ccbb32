import type { ReactNode } from 'react';
import { useLocation } from 'react-router-dom';

export const inputClass =
  'rounded-lg border border-paper-line bg-white px-3 py-1.5 text-body text-ink focus:border-fjord-500 focus:outline-none focus:ring-2 focus:ring-fjord-300';
export const primaryButton =
  'rounded-full bg-fjord-700 px-4 py-1.5 text-caption font-semibold text-paper hover:bg-fjord-900 disabled:opacity-60';
export const quietButton =
  'rounded-full border border-paper-line bg-white px-4 py-1.5 text-caption font-semibold text-ink hover:border-fjord-500 disabled:opacity-60';
export const dangerButton =
  'rounded-full bg-alert-600 px-4 py-1.5 text-caption font-semibold text-white hover:bg-alert-800 disabled:opacity-60';

/** The server's own message when an action fails (a conflict, a validation error). */
export function ActionError({ error }: { error: Error | null }) {
  if (!error) return null;
  return (
    <p role="alert" className="rounded-lg bg-alert-100 px-3 py-2 text-caption font-medium text-alert-800">
      {error.message}
    </p>
  );
}

export function ActionDone({ children }: { children: ReactNode }) {
  return (
    <p role="status" className="rounded-lg bg-moss-100 px-3 py-2 text-caption font-medium text-moss-700">
      {children}
    </p>
  );
}

/** One tool of a moderator panel, folded away until opened (a native disclosure, so keyboard and screen readers know it). */
export function ToolSection({ title, summary, children }: { title: string; summary?: string; children: ReactNode }) {
  return (
    <details className="group border-t border-paper-line py-3 first:border-t-0">
      <summary className="flex cursor-pointer list-none items-baseline gap-3 rounded-lg px-1 focus:outline-none focus-visible:ring-2 focus-visible:ring-fjord-300">
        <span aria-hidden="true" className="text-fjord-700 transition-transform group-open:rotate-90">
          ▸
        </span>
        <span className="font-semibold text-ink">{title}</span>
        {summary && <span className="truncate text-caption text-ink-soft">{summary}</span>}
      </summary>
      <div className="mt-3 space-y-3 pl-6">{children}</div>
    </details>
  );
}

/** After a merge the page moves to the kept entry; what happened travels in the navigation state. */
export function mergedNotice(text: string) {
  return { state: { mergedNotice: text } };
}

/** The frame of a moderator-only panel on a public page. */
export function ModeratorPanel({ title, children }: { title: string; children: ReactNode }) {
  const arrivedAfter = (useLocation().state as { mergedNotice?: string } | null)?.mergedNotice;
  return (
    <section aria-label={title} className="mt-6 rounded-card border border-dashed border-fjord-300 bg-white px-5 py-4 shadow-card">
      <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Moderators only</p>
      <h2 className="text-lead font-semibold text-ink">{title}</h2>
      {arrivedAfter && (
        <div className="mt-2">
          <ActionDone>{arrivedAfter}</ActionDone>
        </div>
      )}
      <div className="mt-2">{children}</div>
    </section>
  );
}
