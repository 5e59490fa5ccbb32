import type { ReactNode } from 'react';

export const inputClass =
  'w-full rounded-lg border border-paper-line bg-white px-3 py-2 text-body text-ink focus:border-fjord-500 focus:outline-none aria-[invalid=true]:border-alert-600';
export const primaryButtonClass =
  'rounded-full bg-fjord-700 px-5 py-2 font-medium text-paper hover:bg-fjord-900 disabled:cursor-not-allowed disabled:opacity-60';
export const quietButtonClass =
  'rounded-full border border-paper-line px-3 py-1 text-caption font-medium text-ink-soft hover:border-fjord-300 hover:text-ink disabled:opacity-60';

export function FormField({
  id,
  label,
  error,
  hint,
  children,
}: {
  id: string;
  label: string;
  error?: string;
  hint?: string;
  children: ReactNode;
}) {
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-caption font-semibold text-ink">
        {label}
      </label>
      {children}
      {hint && !error && <p className="text-caption text-ink-faint">{hint}</p>}
      {error && (
        <p id={`${id}-error`} className="text-caption font-medium text-alert-600">
          {error}
        </p>
      )}
    </div>
  );
}

export function FormError({ message }: { message?: string }) {
  if (!message) return null;
  return (
    <p role="alert" className="rounded-lg bg-alert-100 px-3 py-2 text-caption font-medium text-alert-800">
      {message}
    </p>
  );
}
