import { useMemo, useRef, useState } from 'react';
import { findCadenceSteps, medianStepLag } from '@shared/analysis/cadence-steps';
import { dropoutRows } from '@shared/analysis/dropout-rows';
import { sectionFigures } from '@shared/analysis/section-figures';
import type { RideComparisonView } from '@shared/schemas/submission-view';
import { useRideTrace } from '../api/get-ride-trace';
import { formatSignedSeconds } from '../lib/format';
import { CadenceStepTable, DropoutTable, SprintTable } from './inspection-tables';
import { RideTraceCharts, showSection, type TraceCharts } from './ride-trace-charts';
import { balance, SectionPanel } from './section-panel';

/** Margin shown around a section a table row jumps to. */
const JUMP_MARGIN_SECONDS = 30;

/** Both meters over the ride, a section's figures, and the events the engine found, each row jumping the chart. */
export function RideInspector({
  submissionId,
  result,
  names,
}: {
  submissionId: number;
  result: RideComparisonView;
  names: { a: string; b: string };
}) {
  const trace = useRideTrace(submissionId, true);
  const charts = useRef<TraceCharts>({ power: null, cadence: null });
  const [section, setSection] = useState<{ from: number; to: number } | null>(null);
  const panel = useRef<HTMLDivElement>(null);

  const data = trace.data;
  const rows = useMemo(() => (data ? dropoutRows(result.dropouts, { a: data.aPower, b: data.bPower }) : []), [data, result.dropouts]);
  const steps = useMemo(() => (data ? findCadenceSteps(data.aCadence, data.bCadence) : []), [data]);
  const whole = useMemo(() => (data ? sectionFigures(data, 0, data.length) : null), [data]);

  if (trace.isPending) return <p className="text-caption text-ink-soft">Loading both recordings…</p>;
  if (trace.isError || !data || !whole)
    return <p className="text-caption text-alert-800">The recordings could not be loaded: {trace.error?.message}</p>;

  const chosen = section ?? { from: 0, to: data.length };
  const figures = sectionFigures(data, chosen.from, chosen.to);
  const choose = (from: number, to: number, zoom = false) => {
    const start = Math.max(0, Math.round(Math.min(from, to)));
    const end = Math.min(data.length, Math.round(Math.max(from, to)));
    setSection({ from: start, to: end });
    showSection(
      charts.current,
      start,
      end,
      zoom ? { min: Math.max(0, start - JUMP_MARGIN_SECONDS), max: Math.min(data.length - 1, end + JUMP_MARGIN_SECONDS) } : null,
    );
  };
  const jump = (from: number, to: number) => {
    choose(from, to, true);
    panel.current?.scrollIntoView({ behavior: 'smooth', block: 'start' });
  };
  const zoom = (to: 'section' | 'ride') =>
    showSection(
      charts.current,
      figures.fromSeconds,
      figures.toSeconds,
      to === 'ride'
        ? { min: 0, max: data.length - 1 }
        : { min: figures.fromSeconds, max: Math.max(figures.fromSeconds + 1, figures.toSeconds) },
    );

  const hasBalance = data.aRightBalance.length > 0 || data.bRightBalance.length > 0;
  return (
    <div className="space-y-8">
      <div ref={panel} className="scroll-mt-4 space-y-4">
        <RideTraceCharts
          trace={data}
          dropouts={result.dropouts}
          syncKey={`ride-${submissionId}`}
          charts={charts}
          onSelect={(from, to) => choose(from, to)}
        />
        <SectionPanel
          figures={figures}
          rideSeconds={data.length}
          names={names}
          onChoose={(from, to) => choose(from, to, true)}
          onZoom={zoom}
        />
      </div>

      <div className="grid gap-8 lg:grid-cols-2">
        <Part id="dropout-events" title="Dropouts" lead="Every power dropout of either meter. Choose a start to see it on the chart.">
          <DropoutTable rows={rows} onJump={jump} />
        </Part>
        <Part id="sprints" title="Sprints" lead="Found on B: above twice its ride average for 5 s or more.">
          <SprintTable sprints={result.peaks.sprints} onJump={jump} />
        </Part>
      </div>

      <Part
        id="cadence-response"
        title="Cadence response"
        lead="Where the cadence jumps (on/off efforts, surges), when each meter's reading crossed halfway between the two levels. A positive lag means A follows later than B."
      >
        {steps.length === 0 ? (
          <p className="text-caption text-ink-soft">
            No cadence step of 25 rpm or more on this ride. Ride a few 5-s on/off efforts to see the lag.
          </p>
        ) : (
          <>
            <p className="text-body">
              Median lag on steps up <strong className="tabular-nums">{formatSignedSeconds(medianStepLag(steps, 'up'))}</strong>, on steps
              down <strong className="tabular-nums">{formatSignedSeconds(medianStepLag(steps, 'down'))}</strong> over {steps.length} steps;
              the whole-ride estimate is {formatSignedSeconds(result.cadenceLagSeconds)}.
            </p>
            <CadenceStepTable steps={steps} onJump={jump} />
          </>
        )}
      </Part>

      <Part id="balance" title="Left/right balance">
        {hasBalance ? (
          <p className="text-body" data-testid="ride-balance">
            Over the whole ride, left / right: {balanceOf('A', whole.aRightBalancePercent)}; {balanceOf('B', whole.bRightBalancePercent)}.
            {result.likeForLike.mode === 'via_balance' && ' The comparison used this balance to put one leg against the same leg.'}
          </p>
        ) : (
          <p className="text-caption text-ink-soft">Neither file carries left/right balance.</p>
        )}
      </Part>
    </div>
  );
}

function balanceOf(side: 'A' | 'B', rightPercent: number | null) {
  if (rightPercent === null) return <>{side}’s file carries none</>;
  return (
    <>
      {side} <strong className="tabular-nums">{balance(rightPercent)} %</strong>
    </>
  );
}

function Part({ id, title, lead, children }: { id: string; title: string; lead?: string; children: React.ReactNode }) {
  return (
    <section aria-labelledby={`${id}-title`} className="min-w-0 space-y-3">
      <div>
        <h3 id={`${id}-title`} className="text-body font-semibold">
          {title}
        </h3>
        {lead && <p className="text-caption text-ink-soft">{lead}</p>}
      </div>
      {children}
    </section>
  );
}
