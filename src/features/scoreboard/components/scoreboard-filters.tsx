import { useEffect, useRef, useState } from 'react';
import { MEASUREMENT_POSITIONS } from '@shared/analysis/types';
import { MODEL_KIND_LABELS, MODEL_KINDS } from '@shared/schemas/catalogue';
import type { ScoreboardFilters } from '../api/get-scoreboard';
import { MINIMUM_RIDERS, MINIMUM_SUBMISSIONS } from '@shared/statistics/minimum-evidence';
import { useMakers } from '../api/get-makers';

const fieldClass = 'mt-1 block w-full rounded-lg border border-paper-line bg-white px-3 py-2 text-body text-ink focus:border-fjord-500';

export function ScoreboardFiltersForm({ filters, onChange }: { filters: ScoreboardFilters; onChange: (next: ScoreboardFilters) => void }) {
  const makers = useMakers();
  const [search, setSearch] = useState(filters.q ?? '');
  useEffect(() => setSearch(filters.q ?? ''), [filters.q]);
  // Searching waits for a pause in typing, so the URL and the server are not hit per key;
  // the pause restarts only when the text changes, so the latest filters are read from a ref.
  const latest = useRef({ filters, onChange });
  latest.current = { filters, onChange };
  useEffect(() => {
    const { filters: current, onChange: change } = latest.current;
    if (search === (current.q ?? '')) return;
    const timer = setTimeout(() => change({ ...latest.current.filters, q: search || undefined, page: 1 }), 300);
    return () => clearTimeout(timer);
  }, [search]);

  const set = (key: keyof ScoreboardFilters) => (event: React.ChangeEvent<HTMLSelectElement>) =>
    onChange({ ...filters, [key]: event.target.value || undefined, page: 1 });

  return (
    <search>
      <form className="grid gap-4 sm:grid-cols-2 lg:grid-cols-5" onSubmit={(event) => event.preventDefault()}>
        <label className="text-caption font-medium text-ink-soft lg:col-span-2">
          Search models and makers
          <input
            type="search"
            value={search}
            onChange={(event) => setSearch(event.target.value)}
            className={fieldClass}
            placeholder="e.g. a model name"
          />
        </label>
        <label className="text-caption font-medium text-ink-soft">
          Maker
          <select value={filters.maker ?? ''} onChange={set('maker')} className={fieldClass}>
            <option value="">All makers</option>
            {makers.data?.map((maker) => (
              <option key={maker.slug} value={maker.slug}>
                {maker.name}
              </option>
            ))}
          </select>
        </label>
        <label className="text-caption font-medium text-ink-soft">
          Where it measures
          <select value={filters.position ?? ''} onChange={set('position')} className={fieldClass}>
            <option value="">Any position</option>
            {MEASUREMENT_POSITIONS.map((position) => (
              <option key={position} value={position}>
                {position}
              </option>
            ))}
          </select>
        </label>
        <label className="text-caption font-medium text-ink-soft">
          Kind
          <select value={filters.kind ?? ''} onChange={set('kind')} className={fieldClass}>
            <option value="">Any kind</option>
            {MODEL_KINDS.map((kind) => (
              <option key={kind} value={kind}>
                {MODEL_KIND_LABELS[kind]}
              </option>
            ))}
          </select>
        </label>
        <label className="flex items-center gap-2 text-caption font-medium text-ink-soft sm:col-span-2 lg:col-span-5">
          <input
            type="checkbox"
            checked={filters.evidence === 'enough'}
            onChange={(event) => onChange({ ...filters, evidence: event.target.checked ? 'enough' : undefined, page: 1 })}
            className="h-4 w-4 accent-fjord-700"
          />
          Only models with enough evidence (at least {MINIMUM_SUBMISSIONS} accepted rides by {MINIMUM_RIDERS} riders)
        </label>
      </form>
    </search>
  );
}
