import { signedPercent } from '@/lib/format-figures';
import { useEffect, useState } from 'react';
import type { SectionFigures } from '@shared/analysis/section-figures';
import { formatClock, formatDuration, formatSignedWatts, formatWatts } from '../lib/format';
import { parseClock } from '../lib/ride-clock';
import { sectionText } from '../lib/section-text';
import { FieldError, inputBorder, inputClass } from './form-controls';

const button =
  'rounded-lg border border-fjord-700 px-3 py-1.5 text-caption font-semibold text-fjord-700 hover:bg-fjord-50 focus-visible:outline focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-fjord-500';

/** The chosen section's figures, with a typed way to choose it and a line to copy. */
export function SectionPanel({
  figures,
  rideSeconds,
  names,
  onChoose,
  onZoom,
}: {
  figures: SectionFigures;
  rideSeconds: number;
  names: { a: string; b: string };
  onChoose: (from: number, to: number) => void;
  onZoom: (zoom: 'section' | 'ride') => void;
}) {
  const [from, setFrom] = useState(formatClock(figures.fromSeconds));
  const [to, setTo] = useState(formatClock(figures.toSeconds));
  const [error, setError] = useState<string>();
  const [copied, setCopied] = useState('');
  useEffect(() => {
    setFrom(formatClock(figures.fromSeconds));
    setTo(formatClock(figures.toSeconds));
    setCopied('');
  }, [figures.fromSeconds, figures.toSeconds]);

  const text = sectionText(figures, names);
  const apply = (event: React.FormEvent) => {
    event.preventDefault();
    const start = parseClock(from);
    const end = parseClock(to);
    if (start === null || end === null) return setError('write times as 1:05:09, 5:09, 12 min or seconds');
    if (end <= start) return setError('the end must come after the start');
    if (start >= rideSeconds) return setError(`the ride lasts ${formatClock(rideSeconds)}`);
    setError(undefined);
    onChoose(start, end);
  };
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(text);
      setCopied('Copied.');
    } catch {
      setCopied('Your browser did not let us copy: select the line above instead.');
    }
  };

  return (
    <div className="space-y-4 rounded-card border border-paper-line bg-white p-4 shadow-card" data-testid="section-panel">
      <form onSubmit={apply} className="flex flex-wrap items-end gap-3" aria-label="Choose a section">
        <label className="w-28 text-caption font-semibold text-ink-soft">
          From
          <input
            className={`${inputClass} ${inputBorder(!!error)} mt-1`}
            value={from}
            onChange={(e) => setFrom(e.target.value)}
            name="section-from"
            inputMode="numeric"
            aria-describedby="section-error"
          />
        </label>
        <label className="w-28 text-caption font-semibold text-ink-soft">
          To
          <input
            className={`${inputClass} ${inputBorder(!!error)} mt-1`}
            value={to}
            onChange={(e) => setTo(e.target.value)}
            name="section-to"
            inputMode="numeric"
            aria-describedby="section-error"
          />
        </label>
        <button type="submit" className={button}>
          Show section
        </button>
        <button type="button" className={button} onClick={() => onChoose(0, rideSeconds)}>
          Whole ride
        </button>
        <button type="button" className={button} onClick={() => onZoom('section')}>
          Zoom to section
        </button>
        <button type="button" className={button} onClick={() => onZoom('ride')}>
          Zoom out
        </button>
      </form>
      <FieldError id="section-error" message={error} />

      <dl className="grid grid-cols-2 gap-x-6 gap-y-3 sm:grid-cols-4" aria-live="polite">
        <Figure term={`${names.a} (A), average`} value={formatWatts(figures.aAverageWatts)} tone="text-ember-700" />
        <Figure term={`${names.b} (B), average`} value={formatWatts(figures.bAverageWatts)} tone="text-moss-700" />
        <Figure
          term="A − B"
          value={
            figures.differenceWatts === null
              ? '–'
              : `${formatSignedWatts(figures.differenceWatts, 1)} · ${signedPercent(figures.differencePercent)}`
          }
        />
        <Figure term="Matched seconds" value={`${figures.matchedSeconds} of ${figures.toSeconds - figures.fromSeconds}`} />
        <Figure term="Peak A" value={formatWatts(figures.aPeakWatts)} />
        <Figure term="Peak B" value={formatWatts(figures.bPeakWatts)} />
        <Figure
          term="Section"
          value={`${formatClock(figures.fromSeconds)}–${formatClock(figures.toSeconds)} (${formatDuration(figures.toSeconds - figures.fromSeconds)})`}
        />
        {(figures.aRightBalancePercent !== null || figures.bRightBalancePercent !== null) && (
          <Figure term="L/R balance" value={`A ${balance(figures.aRightBalancePercent)} · B ${balance(figures.bRightBalancePercent)}`} />
        )}
      </dl>

      <div className="flex flex-wrap items-center gap-3">
        <p className="min-w-0 flex-1 rounded-lg bg-paper-deep px-3 py-2 text-caption text-ink" data-testid="section-text">
          {text}
        </p>
        <button type="button" className={button} onClick={copy}>
          Copy as text
        </button>
        <span role="status" className="text-caption text-ink-soft">
          {copied}
        </span>
      </div>
      <p className="text-caption text-ink-faint">
        Averages and the difference use the matched seconds only (both meters reporting, neither inside a dropout), as the ride’s bias does;
        peaks are each meter’s highest one-second reading in the section.
      </p>
    </div>
  );
}

/** Left/right from the right leg's share: 48.5 / 51.5. */
export function balance(rightPercent: number | null): string {
  return rightPercent === null ? '–' : `${(100 - rightPercent).toFixed(1)} / ${rightPercent.toFixed(1)}`;
}

function Figure({ term, value, tone = 'text-ink' }: { term: string; value: string; tone?: string }) {
  return (
    <div className="min-w-0">
      <dt className="text-caption text-ink-soft">{term}</dt>
      <dd className={`font-semibold tabular-nums ${tone}`}>{value}</dd>
    </div>
  );
}
