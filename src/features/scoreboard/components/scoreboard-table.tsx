import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import { MODEL_KIND_LABELS } from '@shared/schemas/catalogue';
import type { ScoreboardPage, ScoreboardRow, ScoreboardSort } from '@shared/schemas/statistics';
import { IntervalBar } from '@/components/ui/interval-bar';
import { NotEnoughData } from '@/components/ui/not-enough-data';
import { hours, percentPlusMinus, perHour, seconds } from '@/lib/format-figures';

const column = createColumnHelper<ScoreboardRow>();

// Column id = the server's sort key; sorting and paging happen on the server.
const columns = [
  column.accessor('name', {
    id: 'name',
    header: 'Model',
    cell: ({ row }) => (
      <div>
        <Link to={`/models/${row.original.slug}`} className="font-medium text-fjord-700 underline-offset-2 hover:underline">
          {row.original.name}
        </Link>
        <div className="text-caption text-ink-faint">
          {MODEL_KIND_LABELS[row.original.kind]} · {row.original.position}
          {row.original.latestFirmware ? ` · fw ${row.original.latestFirmware.version}` : ''}
        </div>
      </div>
    ),
  }),
  column.accessor((row) => row.maker.name, { id: 'maker', header: 'Maker' }),
  column.accessor((row) => row.figures.evidence.submissionCount, {
    id: 'evidence',
    header: 'Evidence',
    cell: ({ row }) => {
      const e = row.original.figures.evidence;
      return (
        <div className="tabular-nums">
          {e.submissionCount} rides
          <div className="text-caption text-ink-faint">
            {e.distinctRiders} riders · {hours(e.pedallingHours)}
          </div>
        </div>
      );
    },
  }),
  column.accessor((row) => row.figures.bias?.meanPercent, {
    id: 'bias',
    header: 'Bias vs partners (95 %)',
    cell: ({ row }) => {
      const bias = row.original.figures.bias;
      if (!bias) return <NotEnoughData riders />;
      return (
        <div className="flex items-center gap-3 tabular-nums">
          <span className="whitespace-nowrap">{percentPlusMinus(bias.meanPercent, bias.lowerPercent, bias.upperPercent)}</span>
          <IntervalBar mean={bias.meanPercent} lower={bias.lowerPercent} upper={bias.upperPercent} />
        </div>
      );
    },
  }),
  column.accessor((row) => row.figures.bias?.scatterPercent, {
    id: 'scatter',
    header: 'Ride-to-ride scatter',
    cell: ({ getValue }) => {
      const value = getValue();
      return value === undefined ? <NotEnoughData riders /> : <span className="tabular-nums">{value.toFixed(1)} % SD</span>;
    },
  }),
  column.accessor((row) => row.figures.powerDropouts?.perHour, {
    id: 'dropouts',
    header: 'Power dropouts',
    cell: ({ row }) => {
      const rate = row.original.figures.powerDropouts;
      if (!rate) return <NotEnoughData riders />;
      return (
        <div className="tabular-nums">
          {perHour(rate.perHour)}
          <div className="text-caption text-ink-faint">
            {rate.lower.toFixed(2)} to {rate.upper.toFixed(2)}
          </div>
        </div>
      );
    },
  }),
  column.accessor((row) => row.figures.medianCadenceLagSeconds, {
    id: 'cadence_lag',
    header: 'Cadence lag',
    cell: ({ row }) =>
      row.original.figures.enough && row.original.figures.medianCadenceLagSeconds !== null ? (
        <span className="tabular-nums">{seconds(row.original.figures.medianCadenceLagSeconds)}</span>
      ) : (
        <NotEnoughData />
      ),
  }),
];

export function ScoreboardTable({
  page,
  sort,
  order,
  onSort,
}: {
  page: ScoreboardPage;
  sort: ScoreboardSort;
  order: 'asc' | 'desc';
  onSort: (sort: ScoreboardSort, order: 'asc' | 'desc') => void;
}) {
  const sorting: SortingState = [{ id: sort, desc: order === 'desc' }];
  const table = useReactTable({
    data: page.rows,
    columns,
    state: { sorting },
    manualSorting: true,
    manualPagination: true,
    getCoreRowModel: getCoreRowModel(),
  });

  return (
    <div className="overflow-x-auto rounded-card border border-paper-line bg-white shadow-card">
      <table className="w-full text-left text-body">
        <caption className="sr-only">Power meter models with their accuracy figures from accepted submissions</caption>
        <thead className="border-b border-paper-line bg-paper-deep/60 text-caption uppercase tracking-wide text-ink-soft">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const id = header.column.id as ScoreboardSort;
                const active = id === sort;
                return (
                  <th
                    key={header.id}
                    scope="col"
                    aria-sort={active ? (order === 'asc' ? 'ascending' : 'descending') : 'none'}
                    className="px-4 py-3 font-semibold"
                  >
                    <button
                      type="button"
                      onClick={() =>
                        onSort(id, active && order === 'desc' ? 'asc' : active ? 'desc' : id === 'name' || id === 'maker' ? 'asc' : 'desc')
                      }
                      className="inline-flex items-center gap-1 rounded hover:text-ink"
                    >
                      {flexRender(header.column.columnDef.header, header.getContext())}
                      <span aria-hidden="true" className={active ? 'text-ember-700' : 'text-paper-line'}>
                        {active && order === 'asc' ? '▲' : '▼'}
                      </span>
                    </button>
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-paper-line/70 last:border-0 hover:bg-fjord-50/50">
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className="px-4 py-3 align-top">
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
          {page.rows.length === 0 && (
            <tr>
              <td colSpan={columns.length} className="px-4 py-10 text-center text-ink-soft">
                No model matches these filters.
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
