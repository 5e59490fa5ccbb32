import { useMemo, useRef } from 'react';
import type uPlot from 'uplot';
import type { Dropouts } from '@shared/analysis/types';
import type { RideTraceResponse } from '@shared/schemas/ride-trace';
import { formatClock } from '../lib/format';
import { drawDropouts } from './difference-chart';
import { axis, CHART_COLOURS, UPlotChart } from './uplot-chart';

export interface TraceCharts {
  power: uPlot | null;
  cadence: uPlot | null;
}

/**
 * A's and B's power drawn over each other, and their cadence in a chart below on the
 * same time axis: the pointer moves on both, a drag on either chooses a section.
 */
export function RideTraceCharts({
  trace,
  dropouts,
  syncKey,
  charts,
  onSelect,
}: {
  trace: RideTraceResponse;
  dropouts: Dropouts;
  syncKey: string;
  charts: React.MutableRefObject<TraceCharts>;
  onSelect: (from: number, to: number) => void;
}) {
  const readout = useRef<HTMLParagraphElement>(null);
  const onSelectRef = useRef(onSelect);
  onSelectRef.current = onSelect;

  const x = useMemo(() => Array.from({ length: trace.length }, (_, i) => i), [trace.length]);
  const powerData = useMemo<uPlot.AlignedData>(() => [x, trace.aPower, trace.bPower], [x, trace]);
  const cadenceData = useMemo<uPlot.AlignedData>(() => [x, trace.aCadence, trace.bCadence], [x, trace]);

  const showReadout = (u: uPlot) => {
    const i = u.cursor.idx;
    if (!readout.current) return;
    if (i == null) {
      readout.current.textContent = 'Point at the chart to read both meters; drag to choose a section.';
      return;
    }
    const w = (v: number | null) => (v === null ? 'no reading' : `${Math.round(v)} W`);
    const c = (v: number | null) => (v === null ? '–' : `${Math.round(v)}`);
    readout.current.textContent = `${formatClock(i)} · A ${w(trace.aPower[i])} · B ${w(trace.bPower[i])} · cadence A ${c(trace.aCadence[i])} / B ${c(trace.bCadence[i])} rpm`;
  };

  const options =
    (kind: 'power' | 'cadence') =>
    (width: number, height: number): uPlot.Options => ({
      width,
      height,
      legend: { show: false },
      cursor: {
        sync: { key: syncKey, setSeries: false },
        drag: { x: true, y: false, setScale: false },
        points: { size: 6 },
      },
      select: { show: true, left: 0, top: 0, width: 0, height: 0 },
      scales: { x: { time: false } },
      axes: [
        axis({ values: (_u, ticks) => ticks.map(formatClock), ...(kind === 'cadence' && { label: 'Ride time (h:min:s)', labelSize: 22 }) }),
        axis({
          values: (_u, ticks) => ticks.map((t) => (kind === 'power' ? `${t} W` : `${t}`)),
          size: 56,
          ...(kind === 'cadence' && { label: 'rpm', labelSize: 18 }),
        }),
      ],
      series: [
        {},
        { label: 'A', stroke: CHART_COLOURS.a, width: 1.25, spanGaps: false, points: { show: false } },
        { label: 'B', stroke: CHART_COLOURS.b, width: 1.25, spanGaps: false, points: { show: false } },
      ],
      hooks: {
        drawClear: [
          (u) =>
            kind === 'power'
              ? drawDropouts(u, dropouts.a.power.events, dropouts.b.power.events)
              : drawDropouts(u, dropouts.a.cadence.events, dropouts.b.cadence.events),
        ],
        setCursor: [showReadout],
        setSelect: [
          (u) => {
            if (u.select.width < 2) return;
            onSelectRef.current(u.posToVal(u.select.left, 'x'), u.posToVal(u.select.left + u.select.width, 'x'));
          },
        ],
      },
    });

  return (
    <figure className="space-y-2">
      <p ref={readout} aria-hidden="true" className="min-h-5 font-medium tabular-nums text-caption text-ink" data-testid="trace-readout">
        Point at the chart to read both meters; drag to choose a section.
      </p>
      <UPlotChart makeOptions={options('power')} data={powerData} height={260} onReady={(chart) => (charts.current.power = chart)} />
      <UPlotChart makeOptions={options('cadence')} data={cadenceData} height={150} onReady={(chart) => (charts.current.cadence = chart)} />
      <figcaption className="flex flex-wrap gap-x-5 gap-y-1 text-caption text-ink-soft">
        <span className="flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-block h-0.5 w-5 bg-ember-500" /> A, power as compared
        </span>
        <span className="flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-block h-0.5 w-5 bg-moss-500" /> B
        </span>
        <span className="flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-block h-3 w-3 rounded-sm bg-ember-300/60" /> A dropped out (upper half)
        </span>
        <span className="flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-block h-3 w-3 rounded-sm bg-moss-500/40" /> B dropped out (lower half)
        </span>
      </figcaption>
    </figure>
  );
}

/** Shows [from, to) on both charts and marks it as the chosen section. */
export function showSection(charts: TraceCharts, from: number, to: number, zoom: { min: number; max: number } | null) {
  for (const chart of [charts.power, charts.cadence]) {
    if (!chart) continue;
    if (zoom) chart.setScale('x', zoom);
    const left = chart.valToPos(from, 'x');
    const right = chart.valToPos(to, 'x');
    chart.setSelect({ left, top: 0, width: Math.max(1, right - left), height: chart.over.clientHeight }, false);
  }
}
