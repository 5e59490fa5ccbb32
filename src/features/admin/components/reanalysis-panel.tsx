import { useId, useState } from 'react';
import type { ReanalysisRunView } from '@shared/schemas/reanalysis';
import { formatDayAndTime } from '@/lib/format-date';
import { useReanalysis } from '../api/get-reanalysis';
import { useStartReanalysis } from '../api/start-reanalysis';

const STATUS_WORDS: Record<ReanalysisRunView['status'], string> = { running: 'Running', finished: 'Finished', failed: 'Failed' };

/** The latest re-analysis run with its progress (read every 2 s while it runs), the earlier runs, and a confirmed start. */
export function ReanalysisPanel() {
  const overview = useReanalysis();
  const start = useStartReanalysis();
  const [confirming, setConfirming] = useState(false);
  const [fromOriginals, setFromOriginals] = useState(false);
  const confirmId = useId();

  if (overview.isPending)
    return (
      <p className="text-ink-soft" role="status">
        Loading the re-analysis runs…
      </p>
    );
  if (overview.isError)
    return (
      <p className="text-alert-800" role="alert">
        Could not load the re-analysis runs: {overview.error.message}
      </p>
    );
  const { currentMethodVersion, outdatedSubmissions, runs } = overview.data;
  const latest = runs[0];
  const running = latest?.status === 'running';

  function confirm() {
    start.mutateAsync(fromOriginals ? 'originals' : 'streams').then(
      () => setConfirming(false),
      () => setConfirming(false), // shown from start.error
    );
  }

  return (
    <div className="space-y-6">
      {latest && <RunProgress run={latest} />}
      <section aria-labelledby={`${confirmId}-start`} className="space-y-3 rounded-card border border-paper-line bg-white p-5 shadow-card">
        <h2 id={`${confirmId}-start`} className="text-lead font-semibold">
          Re-analyse with method {currentMethodVersion}
        </h2>
        <p className="text-caption text-ink-soft" role="status">
          {outdatedSubmissions === 0
            ? `Every stored ride is analysed with method ${currentMethodVersion}.`
            : `${outdatedSubmissions} stored ${outdatedSubmissions === 1 ? 'ride was' : 'rides were'} analysed with an older method.`}
        </p>
        {!confirming && (
          <button
            type="button"
            disabled={running || start.isPending}
            onClick={() => setConfirming(true)}
            className="rounded-full bg-fjord-700 px-4 py-2 font-medium text-paper hover:bg-fjord-900 disabled:cursor-not-allowed disabled:opacity-50"
          >
            {running ? 'A run is in progress' : 'Start a re-analysis…'}
          </button>
        )}
        {confirming && (
          <div
            role="alertdialog"
            aria-labelledby={`${confirmId}-confirm`}
            className="max-w-2xl space-y-3 rounded-card border border-caution-600 bg-caution-100 p-4"
          >
            <p id={`${confirmId}-confirm`} className="font-semibold text-ink">
              Re-analyse {outdatedSubmissions} {outdatedSubmissions === 1 ? 'ride' : 'rides'} with method {currentMethodVersion}?
            </p>
            <ul className="list-disc space-y-1 pl-5 text-ink">
              <li>Each ride's result, flags and headline figures are replaced by the current method's; moderators' decisions stay.</li>
              <li>An accepted ride whose new result raises a severe flag goes back to the review queue, with the reason.</li>
              <li>The statistics are rebuilt once, when the last ride is done.</li>
            </ul>
            <label className="flex items-start gap-2 text-ink">
              <input type="checkbox" className="mt-1" checked={fromOriginals} onChange={(e) => setFromOriginals(e.target.checked)} />
              <span>
                Also decode the kept original files again where an older decoder read them (rides uploaded before originals were kept keep
                their streams).
              </span>
            </label>
            <div className="flex flex-wrap gap-2">
              <button
                type="button"
                // biome-ignore lint/a11y/noAutofocus: the confirmation step replaces the button just pressed, so focus moves to its first action
                autoFocus
                disabled={start.isPending}
                onClick={confirm}
                className="rounded-full bg-alert-600 px-4 py-2 font-semibold text-white hover:bg-alert-800 disabled:opacity-60"
              >
                {start.isPending ? 'Starting…' : 'Start the re-analysis'}
              </button>
              <button
                type="button"
                disabled={start.isPending}
                onClick={() => setConfirming(false)}
                className="rounded-full px-4 py-2 font-medium text-fjord-700 hover:bg-paper-deep"
              >
                Cancel
              </button>
            </div>
          </div>
        )}
        {start.error && (
          <p role="alert" className="rounded-lg bg-alert-100 px-3 py-2 text-caption font-medium text-alert-800">
            {start.error.message}
          </p>
        )}
      </section>
      {runs.length > 1 && <EarlierRuns runs={runs.slice(1)} />}
    </div>
  );
}

function RunProgress({ run }: { run: ReanalysisRunView }) {
  const counted = run.done + run.failed;
  const share = run.total === 0 ? 1 : counted / run.total;
  return (
    <section aria-labelledby="reanalysis-latest" className="space-y-3 rounded-card border border-paper-line bg-white p-5 shadow-card">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="reanalysis-latest" className="text-lead font-semibold">
          Run {run.id} · method {run.methodVersion}
        </h2>
        <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">{STATUS_WORDS[run.status]}</p>
      </div>
      <div
        role="progressbar"
        aria-label={`Run ${run.id} progress`}
        aria-valuemin={0}
        aria-valuemax={run.total}
        aria-valuenow={counted}
        className="h-3 overflow-hidden rounded-full bg-paper-deep"
      >
        <div className="h-full rounded-full bg-fjord-700 transition-[width]" style={{ width: `${Math.round(share * 100)}%` }} />
      </div>
      <dl className="grid grid-cols-3 gap-3 text-caption">
        {(
          [
            ['Done', `${run.done} of ${run.total}`],
            ['Failed', run.failed],
            ['Sent back to review', run.sentBack],
          ] as const
        ).map(([term, value]) => (
          <div key={term} className="rounded-lg bg-paper-deep p-3">
            <dt className="text-ink-soft">{term}</dt>
            <dd className="text-title font-semibold tabular-nums">{value}</dd>
          </div>
        ))}
      </dl>
      <p className="text-caption text-ink-soft">
        Started {formatDayAndTime(run.startedAt)}
        {run.startedBy ? ` by ${run.startedBy.name}` : ' from the command line'}
        {run.finishedAt ? `; ended ${formatDayAndTime(run.finishedAt)}` : ''}.
      </p>
      {run.lastError && <p className="text-caption text-alert-800">Last error: {run.lastError}</p>}
    </section>
  );
}

function EarlierRuns({ runs }: { runs: ReanalysisRunView[] }) {
  return (
    <section aria-labelledby="reanalysis-earlier" className="space-y-2">
      <h2 id="reanalysis-earlier" className="text-lead font-semibold">
        Earlier runs
      </h2>
      <ul className="space-y-1 text-caption text-ink-soft">
        {runs.map((run) => (
          <li key={run.id}>
            Run {run.id}, method {run.methodVersion}: {STATUS_WORDS[run.status].toLowerCase()}{' '}
            {formatDayAndTime(run.finishedAt ?? run.startedAt)} — {run.done} of {run.total} re-analysed, {run.failed} failed, {run.sentBack}{' '}
            sent back
          </li>
        ))}
      </ul>
    </section>
  );
}
