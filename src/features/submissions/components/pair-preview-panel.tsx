import { signedPercent } from '@/lib/format-figures';
import type { PairPreviewState } from '../hooks/use-pair-preview';
import { formatDuration, formatLimitsOfAgreement, formatSignedSeconds } from '../lib/format';
import { FlagList } from './flag-list';

/** The browser's own first look at the pair, before anything is uploaded. */
export function PairPreviewPanel({ state }: { state: PairPreviewState }) {
  return (
    <section aria-labelledby="preview-title" aria-live="polite" className="rounded-card border border-fjord-100 bg-fjord-50 p-5 sm:p-6">
      <h2 id="preview-title" className="text-lead font-semibold text-fjord-900">
        First look, in your browser
      </h2>
      {state.status === 'idle' && (
        <p className="mt-2 text-caption text-ink-soft">
          Add both files and your browser reads them right here, nothing is uploaded yet, so you can see at once whether they belong to the
          same ride.
        </p>
      )}
      {state.status === 'working' && (
        <p className="mt-2 flex items-center gap-2 text-caption text-ink-soft">
          <span aria-hidden="true" className="h-3 w-3 animate-spin rounded-full border-2 border-fjord-300 border-t-fjord-700" />
          Reading both files and lining them up…
        </p>
      )}
      {state.status === 'done' && !state.answer.ok && (
        <p className="mt-2 text-caption font-medium text-alert-800">
          {state.answer.error.side ? 'One file could not be used; see the message on it above.' : state.answer.error.message}
        </p>
      )}
      {state.status === 'done' && state.answer.ok && (
        <>
          <dl className="mt-4 grid grid-cols-2 gap-4 sm:grid-cols-4">
            <PreviewFigure term="Recorded by both" value={formatDuration(state.answer.preview.overlapSeconds)} />
            <PreviewFigure
              term="Clock offset"
              value={formatSignedSeconds(state.answer.preview.clockOffsetSeconds)}
              note={state.answer.preview.clockOffsetSeconds === 0 ? 'clocks agree' : 'A ahead of B'}
            />
            <PreviewFigure
              term="First bias, A vs B"
              value={signedPercent(state.answer.preview.biasPercent)}
              note={`LoA ${formatLimitsOfAgreement(state.answer.preview.lowerLimitPercent, state.answer.preview.upperLimitPercent)}`}
              accent
            />
            <PreviewFigure
              term="Traces move together"
              value={`r = ${state.answer.preview.correlation.toFixed(2)}`}
              note={state.answer.preview.correlation > 0.8 ? 'looks like one ride' : 'check the pairing'}
            />
          </dl>
          {state.answer.preview.flags.length > 0 && (
            <div className="mt-4">
              <FlagList flags={state.answer.preview.flags} compact />
            </div>
          )}
          <p className="mt-4 text-caption text-ink-soft">
            A first figure only: after upload the full analysis runs on our server and a moderator reviews it.
          </p>
        </>
      )}
    </section>
  );
}

function PreviewFigure({ term, value, note, accent }: { term: string; value: string; note?: string; accent?: boolean }) {
  return (
    <div>
      <dt className="text-caption text-ink-soft">{term}</dt>
      <dd className={`text-lead font-semibold tabular-nums ${accent ? 'text-ember-700' : 'text-ink'}`}>{value}</dd>
      {note && <dd className="text-caption text-ink-soft">{note}</dd>}
    </div>
  );
}
