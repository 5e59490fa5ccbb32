import { useMemo } from 'react';
import type uPlot from 'uplot';
import type { DropoutEvent } from '@shared/analysis/types';
import type { RideComparisonView } from '@shared/schemas/submission-view';
import { formatClock, formatSignedWatts } from '../lib/format';
import { axis, CHART_COLOURS, UPlotChart } from './uplot-chart';

/** A − B over the ride, with each meter's power dropouts shaded in its own colour. */
export function DifferenceChart({ result }: { result: RideComparisonView }) {
  const { series, dropouts } = result;
  const data = useMemo<uPlot.AlignedData>(() => {
    const x = series.differenceWatts.map((_, i) => i * series.intervalSeconds);
    return [x, series.differenceWatts.map((v) => v ?? null)];
  }, [series]);

  const makeOptions = (width: number, height: number): uPlot.Options => ({
    width,
    height,
    legend: { show: false },
    cursor: { drag: { x: true, y: false }, points: { size: 7, fill: CHART_COLOURS.aDeep } },
    scales: { x: { time: false } },
    axes: [
      axis({ values: (_u, ticks) => ticks.map(formatClock), label: 'Ride time (h:min:s)', labelSize: 22 }),
      axis({ values: (_u, ticks) => ticks.map((t) => `${t > 0 ? '+' : ''}${t} W`), size: 56 }),
    ],
    series: [
      {},
      { label: 'A − B', stroke: CHART_COLOURS.a, width: 1.5, fill: 'rgba(200, 98, 46, 0.10)', spanGaps: false, points: { show: false } },
    ],
    hooks: {
      drawClear: [(u) => drawDropouts(u, dropouts.a.power.events, dropouts.b.power.events)],
      draw: [(u) => drawZeroLine(u)],
    },
  });

  const aCount = dropouts.a.power.count;
  const bCount = dropouts.b.power.count;
  return (
    <figure className="space-y-3">
      <UPlotChart makeOptions={makeOptions} data={data} height={260} />
      <figcaption className="flex flex-wrap gap-x-5 gap-y-1 text-caption text-ink-soft">
        <span className="flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-block h-0.5 w-5 bg-ember-500" /> A − B, mean per {series.intervalSeconds} s (mean{' '}
          {formatSignedWatts(result.bias.meanDifferenceWatts, 1)})
        </span>
        <span className="flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-block h-3 w-3 rounded-sm bg-ember-300/60" /> A dropped out ({aCount})
        </span>
        <span className="flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-block h-3 w-3 rounded-sm bg-moss-500/40" /> B dropped out ({bCount})
        </span>
      </figcaption>
    </figure>
  );
}

/** A's dropouts shade the upper half of the plot, B's the lower. */
export function drawDropouts(u: uPlot, aEvents: DropoutEvent[], bEvents: DropoutEvent[]) {
  const { ctx, bbox } = u;
  ctx.save();
  const half = bbox.height / 2;
  // A's dropouts shade the upper half of the plot, B's the lower, so overlapping events stay visible.
  const band = (events: DropoutEvent[], colour: string, top: number) => {
    ctx.fillStyle = colour;
    for (const event of events) {
      const x0 = u.valToPos(event.startSeconds, 'x', true);
      const x1 = u.valToPos(event.endSeconds, 'x', true);
      ctx.fillRect(x0, top, Math.max(2, x1 - x0), half);
    }
  };
  band(aEvents, 'rgba(235, 154, 108, 0.45)', bbox.top);
  band(bEvents, 'rgba(93, 127, 47, 0.32)', bbox.top + half);
  ctx.restore();
}

export function drawZeroLine(u: uPlot, value = 0, colour = CHART_COLOURS.fjord, dash: number[] = []) {
  const { ctx, bbox } = u;
  const y = u.valToPos(value, 'y', true);
  if (y < bbox.top || y > bbox.top + bbox.height) return;
  ctx.save();
  ctx.strokeStyle = colour;
  ctx.lineWidth = 1.25 * devicePixelRatio;
  ctx.setLineDash(dash.map((d) => d * devicePixelRatio));
  ctx.beginPath();
  ctx.moveTo(bbox.left, y);
  ctx.lineTo(bbox.left + bbox.width, y);
  ctx.stroke();
  ctx.restore();
}
