import { useSearchParams } from 'react-router-dom';
import { scoreboardQuery, OPEN_DATA_LICENCE } from '@shared/schemas/statistics';
import { scoreboardSearch, useScoreboard, type ScoreboardFilters } from '@/features/scoreboard/api/get-scoreboard';
import { ScoreboardFiltersForm } from '@/features/scoreboard/components/scoreboard-filters';
import { ScoreboardTable } from '@/features/scoreboard/components/scoreboard-table';

export function ScoreboardRoute() {
  const [params, setParams] = useSearchParams();
  // The URL is the filter state; the server's own schema reads it (bad values fall back to defaults).
  const parsed = scoreboardQuery.safeParse(Object.fromEntries(params));
  const query = parsed.success ? parsed.data : scoreboardQuery.parse({});
  const filters: ScoreboardFilters = { ...query, evidence: query.evidence === 'enough' ? 'enough' : undefined };
  const scoreboard = useScoreboard(filters);
  const update = (next: ScoreboardFilters) => setParams(new URLSearchParams(scoreboardSearch(next)), { replace: false });
  const page = scoreboard.data;
  const pages = page ? Math.max(1, Math.ceil(page.total / page.pageSize)) : 1;

  return (
    <div>
      <h1 className="text-title font-semibold text-ink">Scoreboard</h1>
      <p className="mt-2 max-w-3xl text-lead text-ink-soft">
        How each power meter model reads against the meters riders paired it with, from accepted submissions only. Every figure carries its
        95 % interval; below 3 rides or 3 riders we say so rather than guess.
      </p>
      <div className="mt-8">
        <ScoreboardFiltersForm filters={filters} onChange={update} />
      </div>
      <div className="mt-6" aria-busy={scoreboard.isFetching}>
        {scoreboard.isError && (
          <p role="alert" className="rounded-card bg-alert-100 px-4 py-3 text-alert-800">
            {scoreboard.error.message}
          </p>
        )}
        {page && (
          <ScoreboardTable
            page={page}
            sort={query.sort}
            order={query.order}
            onSort={(sort, order) => update({ ...filters, sort, order, page: 1 })}
          />
        )}
        {!page && scoreboard.isPending && <p className="text-ink-soft">Loading the scoreboard…</p>}
      </div>
      {page && (
        <nav aria-label="Scoreboard pages" className="mt-4 flex flex-wrap items-center justify-between gap-3 text-caption text-ink-soft">
          <span>
            {page.total} models · page {page.page} of {pages}
          </span>
          <span className="flex gap-2">
            <button
              type="button"
              disabled={page.page <= 1}
              onClick={() => update({ ...filters, page: page.page - 1 })}
              className="rounded-full border border-paper-line px-3 py-1 disabled:opacity-40"
            >
              Previous
            </button>
            <button
              type="button"
              disabled={page.page >= pages}
              onClick={() => update({ ...filters, page: page.page + 1 })}
              className="rounded-full border border-paper-line px-3 py-1 disabled:opacity-40"
            >
              Next
            </button>
          </span>
        </nav>
      )}
      <p className="mt-8 text-caption text-ink-soft">
        Open data:{' '}
        <a
          className="text-fjord-700 underline"
          href={`/api/scoreboard.csv?${scoreboardSearch({ ...filters, sort: undefined, order: undefined, page: undefined, pageSize: undefined })}`}
        >
          this scoreboard as CSV
        </a>{' '}
        ·{' '}
        <a className="text-fjord-700 underline" href="/api/submissions.csv">
          every accepted submission as CSV
        </a>{' '}
        — licensed{' '}
        <a className="text-fjord-700 underline" href={OPEN_DATA_LICENCE.url}>
          {OPEN_DATA_LICENCE.name}
        </a>
        . Figures are crowdsourced, not a calibration certificate:{' '}
        <a className="text-fjord-700 underline" href="/methodology">
          how they are made
        </a>
        .
      </p>
    </div>
  );
}
