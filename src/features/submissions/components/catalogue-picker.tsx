import { useId, useState } from 'react';
import { FieldError, inputBorder, inputClass } from './form-controls';

export interface PickerOption {
  value: number;
  label: string;
  /** Shown after the label, e.g. "pending review" or "beta". */
  note?: string;
}

const SEARCH_FROM = 8;

/**
 * A native select (the best picker on a phone, typeahead on a keyboard) with a
 * search box above it once the list is long enough to need one.
 */
export function CataloguePicker({
  id,
  label,
  options,
  value,
  onChange,
  error,
  disabled,
  placeholder,
}: {
  id: string;
  label: string;
  options: PickerOption[];
  value: string;
  onChange: (value: string) => void;
  error?: string;
  disabled?: boolean;
  placeholder: string;
}) {
  const [search, setSearch] = useState('');
  const searchId = useId();
  const errorId = `${id}-error`;
  const needle = search.trim().toLowerCase();
  const shown = needle ? options.filter((o) => o.label.toLowerCase().includes(needle) || String(o.value) === value) : options;

  return (
    <div>
      <label htmlFor={id} className="mb-1.5 block text-caption font-semibold text-ink">
        {label}
      </label>
      {options.length >= SEARCH_FROM && !disabled && (
        <input
          id={searchId}
          type="search"
          aria-label={`Search ${label.toLowerCase()}`}
          aria-controls={id}
          placeholder="Type to narrow the list"
          value={search}
          onChange={(e) => setSearch(e.target.value)}
          className={`${inputClass} ${inputBorder(false)} mb-1.5 py-1.5 text-caption`}
        />
      )}
      <select
        id={id}
        value={value}
        disabled={disabled}
        onChange={(e) => onChange(e.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errorId : undefined}
        className={`${inputClass} ${inputBorder(Boolean(error))}`}
      >
        <option value="">{placeholder}</option>
        {shown.map((option) => (
          <option key={option.value} value={option.value}>
            {option.note ? `${option.label} (${option.note})` : option.label}
          </option>
        ))}
      </select>
      {needle && shown.length === 0 && <p className="mt-1 text-caption text-ink-soft">Nothing matches “{search.trim()}”.</p>}
      <FieldError id={errorId} message={error} />
    </div>
  );
}
