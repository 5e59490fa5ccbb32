// Shared looks of the equipment forms, in the house style of the other forms.
export const fieldClass =
  'rounded-lg border border-paper-line bg-white px-3 py-2 text-body text-ink focus:border-fjord-500 focus:outline-none focus:ring-2 focus:ring-fjord-300';
export const labelClass = 'text-caption font-medium text-ink';
export const primaryButton =
  'rounded-full bg-fjord-700 px-5 py-2 text-caption font-semibold text-paper hover:bg-fjord-900 disabled:opacity-60';
export const quietButton =
  'rounded-full border border-paper-line bg-white px-4 py-1.5 text-caption font-semibold text-ink hover:border-fjord-500 disabled:opacity-60';

export const today = () => new Date().toISOString().slice(0, 10);
