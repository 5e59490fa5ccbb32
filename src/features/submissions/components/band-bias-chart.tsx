import { signedPercent } from '@/lib/format-figures';
import { useMemo } from 'react';
import uPlot from 'uplot';
import type { BandBias } from '@shared/analysis/types';
import { formatDuration } from '../lib/format';
import { drawZeroLine } from './difference-chart';
import { axis, CHART_COLOURS, chartFont, UPlotChart } from './uplot-chart';

const bars = uPlot.paths.bars!({ size: [0.62, 64], align: 0 });

/** Bias of A against B in each power or cadence band, with how long each band was ridden. */
export function BandBiasChart({ bands }: { bands: BandBias[] }) {
  const data = useMemo<uPlot.AlignedData>(() => [bands.map((_, i) => i), bands.map((b) => b.percent)], [bands]);

  const makeOptions = (width: number, height: number): uPlot.Options => ({
    width,
    height,
    legend: { show: false },
    cursor: { show: false },
    scales: {
      x: { time: false, range: [-0.6, bands.length - 0.4] },
      y: {
        range: (_u, min, max) => {
          const extent = Math.max(2, Math.abs(min ?? 0), Math.abs(max ?? 0)) * 1.2;
          return [-extent, extent];
        },
      },
    },
    axes: [
      axis({
        splits: () => bands.map((_, i) => i),
        values: (_u, ticks) => ticks.map((t) => bandLabel(bands[t])),
        grid: { show: false },
        label: unitOf(bands) === 'rpm' ? 'Cadence (rpm)' : 'Power (W)',
        // Five band labels share a phone's width: a size smaller keeps them apart.
        font: width < 420 ? chartFont.replace('12px', '10.5px') : chartFont,
        labelSize: 22,
        size: 30,
      }),
      axis({ values: (_u, ticks) => ticks.map((t) => `${t > 0 ? '+' : ''}${t} %`), size: 52 }),
    ],
    series: [
      {},
      {
        label: 'Bias',
        paths: bars,
        points: { show: false },
        stroke: CHART_COLOURS.aDeep,
        fill: 'rgba(200, 98, 46, 0.75)',
      },
    ],
    hooks: { draw: [(u) => drawZeroLine(u)] },
  });

  return (
    <figure className="space-y-2">
      <UPlotChart makeOptions={makeOptions} data={data} height={220} />
      <details className="text-caption text-ink-soft">
        <summary className="cursor-pointer font-medium text-fjord-700">The numbers behind the bars</summary>
        <table className="mt-2 w-full max-w-md tabular-nums">
          <thead>
            <tr className="text-left">
              <th className="py-1 font-semibold">Band</th>
              <th className="py-1 text-right font-semibold">Bias</th>
              <th className="py-1 text-right font-semibold">Ridden</th>
            </tr>
          </thead>
          <tbody>
            {bands.map((b) => (
              <tr key={b.label} className="border-t border-paper-line">
                <td className="py-1">{b.label}</td>
                <td className="py-1 text-right">{signedPercent(b.percent)}</td>
                <td className="py-1 text-right">{formatDuration(b.matchedSeconds)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </figure>
  );
}

/** The engine's band label without its unit, which the axis title carries: "150–250", "≥ 700". */
function bandLabel(band: BandBias | undefined): string {
  return band?.label.replace(/ (W|rpm)$/, '') ?? '';
}

function unitOf(bands: BandBias[]): string {
  return / rpm$/.test(bands[0]?.label ?? '') ? 'rpm' : 'W';
}
