import type { ReactNode } from 'react';

export function FieldError({ id, message }: { id: string; message?: string }) {
  if (!message) return null;
  return (
    <p id={id} className="mt-1.5 flex gap-1.5 text-caption font-medium text-alert-800">
      <span aria-hidden="true">⚠</span>
      <span>{capitalise(message)}</span>
    </p>
  );
}

export function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

export const inputClass =
  'w-full rounded-lg border bg-white px-3 py-2 text-body text-ink shadow-sm transition-colors placeholder:text-ink-faint disabled:cursor-not-allowed disabled:bg-paper-deep disabled:text-ink-faint';

export function inputBorder(invalid: boolean) {
  return invalid ? 'border-alert-600 ring-1 ring-alert-600' : 'border-paper-line hover:border-fjord-300 focus:border-fjord-500';
}

interface Choice<T extends string> {
  value: T;
  label: string;
}

/** A row of radio buttons drawn as pills: one tap on a phone, arrow keys on a keyboard. */
export function ChoiceGroup<T extends string>({
  name,
  legend,
  choices,
  value,
  onChange,
  error,
  hint,
  accent = 'fjord',
}: {
  name: string;
  legend: string;
  choices: readonly Choice<T>[];
  value: T | '';
  onChange: (value: T) => void;
  error?: string;
  hint?: ReactNode;
  accent?: 'fjord' | 'ember';
}) {
  const errorId = `${name}-error`;
  const checked =
    accent === 'ember'
      ? 'has-[:checked]:border-ember-700 has-[:checked]:bg-ember-700'
      : 'has-[:checked]:border-fjord-700 has-[:checked]:bg-fjord-700';
  return (
    <fieldset aria-describedby={error ? errorId : undefined} aria-invalid={error ? true : undefined}>
      <legend className="mb-1.5 text-caption font-semibold text-ink">{legend}</legend>
      {hint && <p className="-mt-1 mb-2 text-caption text-ink-soft">{hint}</p>}
      <div className="flex flex-wrap gap-2">
        {choices.map((choice) => (
          <label
            key={choice.value}
            className={`cursor-pointer rounded-full border bg-white px-3.5 py-1.5 text-caption font-medium text-ink-soft transition-colors hover:border-fjord-300 has-[:checked]:text-paper has-[:focus-visible]:outline has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-ember-300 ${checked} ${
              error ? 'border-alert-600' : 'border-paper-line'
            }`}
          >
            <input
              type="radio"
              name={name}
              value={choice.value}
              checked={value === choice.value}
              onChange={() => onChange(choice.value)}
              className="sr-only"
            />
            {choice.label}
          </label>
        ))}
      </div>
      <FieldError id={errorId} message={error} />
    </fieldset>
  );
}
