import { useId, useMemo, useState } from 'react';
import { inputClass } from './curation-parts';

export interface PickableEntry {
  id: number;
  name: string;
  /** Shown after the name, e.g. the maker or "beta". */
  hint?: string;
}

const SHOWN = 8;

/** A searchable list of catalogue entries to pick one from: a search box and radio buttons, so it works from the keyboard. */
export function EntryPicker({
  label,
  entries,
  value,
  onChange,
}: {
  label: string;
  entries: PickableEntry[];
  value: number | null;
  onChange: (id: number) => void;
}) {
  const id = useId();
  const [search, setSearch] = useState('');
  const matching = useMemo(() => {
    const words = search.toLowerCase().split(/\s+/).filter(Boolean);
    return entries.filter((entry) => words.every((word) => `${entry.name} ${entry.hint ?? ''}`.toLowerCase().includes(word)));
  }, [entries, search]);
  const chosen = entries.find((entry) => entry.id === value);
  // The chosen entry stays visible even when the search no longer matches it.
  const shown = [...(chosen && !matching.slice(0, SHOWN).includes(chosen) ? [chosen] : []), ...matching.slice(0, SHOWN)];
  return (
    <fieldset className="min-w-0 space-y-2">
      <legend className="text-caption font-medium text-ink">{label}</legend>
      <input
        type="search"
        aria-label={`Search: ${label}`}
        placeholder="Type to search…"
        value={search}
        onChange={(e) => setSearch(e.target.value)}
        className={`${inputClass} w-full max-w-sm`}
      />
      {entries.length === 0 ? (
        <p className="text-caption text-ink-soft">There is nothing to choose from.</p>
      ) : (
        <ul className="max-w-lg divide-y divide-paper-line rounded-lg border border-paper-line bg-paper">
          {shown.map((entry) => (
            <li key={entry.id}>
              <label
                className={`flex cursor-pointer items-baseline gap-2 px-3 py-1.5 text-body ${entry.id === value ? 'bg-fjord-50 font-semibold' : ''}`}
              >
                <input
                  type="radio"
                  name={id}
                  checked={entry.id === value}
                  onChange={() => onChange(entry.id)}
                  className="accent-fjord-700"
                />
                <span>{entry.name}</span>
                {entry.hint && <span className="text-caption font-normal text-ink-soft">{entry.hint}</span>}
              </label>
            </li>
          ))}
          {matching.length === 0 && <li className="px-3 py-1.5 text-caption text-ink-soft">Nothing matches “{search}”.</li>}
          {matching.length > SHOWN && (
            <li className="px-3 py-1.5 text-caption text-ink-soft">{matching.length - SHOWN} more: narrow the search.</li>
          )}
        </ul>
      )}
    </fieldset>
  );
}
