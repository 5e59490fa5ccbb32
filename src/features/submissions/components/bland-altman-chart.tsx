import { useMemo } from 'react';
import type uPlot from 'uplot';
import type { Agreement } from '@shared/analysis/types';
import { formatSignedWatts } from '../lib/format';
import { drawZeroLine } from './difference-chart';
import { axis, CHART_COLOURS, chartFont, UPlotChart } from './uplot-chart';

/**
 * Bland–Altman plot of the 30 s blocks: the mean of both meters against their
 * difference, with the bias and the 95 % limits of agreement (Bland & Altman,
 * Lancet 1986; 327(8476):307–310).
 */
export function BlandAltmanChart({ agreement }: { agreement: Agreement }) {
  const data = useMemo<uPlot.AlignedData>(() => {
    const points = agreement.blocks
      .map((b) => ({ mean: (b.aWatts + b.bWatts) / 2, diff: b.aWatts - b.bWatts }))
      .sort((p, q) => p.mean - q.mean);
    return [points.map((p) => p.mean), points.map((p) => p.diff)];
  }, [agreement]);

  const { meanDifferenceWatts: mean, lowerLimitWatts: lower, upperLimitWatts: upper } = agreement;
  const makeOptions = (width: number, height: number): uPlot.Options => ({
    width,
    height,
    legend: { show: false },
    cursor: { points: { size: 9, fill: CHART_COLOURS.aDeep } },
    scales: {
      x: { time: false },
      // Keep the limits in view even when every block sits between them.
      y: {
        range: (_u, min, max) => {
          const lo = Math.min(min, lower ?? min, 0);
          const hi = Math.max(max, upper ?? max, 0);
          const pad = (hi - lo) * 0.12 || 5;
          return [Math.floor(lo - pad), Math.ceil(hi + pad)];
        },
      },
    },
    axes: [
      axis({ values: (_u, ticks) => ticks.map((t) => `${t} W`), label: 'Mean of A and B', labelSize: 22 }),
      axis({ values: (_u, ticks) => ticks.map((t) => `${t > 0 ? '+' : ''}${t} W`), size: 56, label: 'A − B', labelSize: 20 }),
    ],
    series: [
      {},
      {
        label: 'Block',
        stroke: CHART_COLOURS.a,
        paths: () => null,
        points: { show: true, size: 7, width: 1, stroke: CHART_COLOURS.aDeep, fill: 'rgba(200, 98, 46, 0.55)' },
      },
    ],
    hooks: {
      draw: [
        (u) => {
          drawZeroLine(u, 0, 'rgba(29, 36, 40, 0.35)');
          if (mean != null) drawLabelledLine(u, mean, `bias ${formatSignedWatts(mean, 1)}`, []);
          if (lower != null) drawLabelledLine(u, lower, `−1.96 SD ${formatSignedWatts(lower, 1)}`, [6, 4]);
          if (upper != null) drawLabelledLine(u, upper, `+1.96 SD ${formatSignedWatts(upper, 1)}`, [6, 4]);
        },
      ],
    },
  });

  return (
    <figure className="space-y-2">
      <UPlotChart makeOptions={makeOptions} data={data} height={280} />
      <figcaption className="text-caption text-ink-soft">
        Each dot is one {agreement.blockSeconds} s block ({agreement.blockCount} in all). Solid line: the bias; dashed: the limits of
        agreement, where 95 % of blocks are expected to fall.
      </figcaption>
    </figure>
  );
}

function drawLabelledLine(u: uPlot, value: number, label: string, dash: number[]) {
  drawZeroLine(u, value, CHART_COLOURS.fjord, dash);
  const { ctx, bbox } = u;
  const y = u.valToPos(value, 'y', true);
  ctx.save();
  ctx.font = chartFont.replace('12px', `${Math.round(11 * devicePixelRatio)}px`);
  ctx.textAlign = 'right';
  ctx.textBaseline = 'bottom';
  const x = bbox.left + bbox.width - 4 * devicePixelRatio;
  const textY = y - 3 * devicePixelRatio;
  // A paper-coloured backing keeps the label legible over the dots.
  const { width } = ctx.measureText(label);
  const pad = 3 * devicePixelRatio;
  const height = 13 * devicePixelRatio;
  ctx.fillStyle = 'rgba(248, 246, 241, 0.88)';
  ctx.fillRect(x - width - pad, textY - height, width + 2 * pad, height + pad / 2);
  ctx.fillStyle = CHART_COLOURS.fjord;
  ctx.fillText(label, x, textY);
  ctx.restore();
}
