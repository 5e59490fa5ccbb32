import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';

/** Our chart palette, taken from the Tailwind theme: A in ember, B in moss, structure in fjord. */
export const CHART_COLOURS = {
  a: '#c8622e',
  aDeep: '#96421a',
  b: '#5d7f2f',
  fjord: '#1d5557',
  fjordSoft: 'rgba(47, 123, 126, 0.14)',
  grid: 'rgba(29, 36, 40, 0.08)',
  axis: '#4a5358',
  alert: 'rgba(180, 40, 40, 0.16)',
  alertLine: '#b42828',
};

export const chartFont = '12px "Work Sans", system-ui, sans-serif';

export function axis(overrides: uPlot.Axis = {}): uPlot.Axis {
  return {
    stroke: CHART_COLOURS.axis,
    font: chartFont,
    labelFont: `600 ${chartFont}`,
    grid: { stroke: CHART_COLOURS.grid, width: 1 },
    ticks: { stroke: CHART_COLOURS.grid, width: 1, size: 4 },
    ...overrides,
  };
}

/**
 * Mounts a uPlot chart and keeps it as wide as its container. The options are
 * built by the caller for its width; data changes rebuild the chart.
 */
export function UPlotChart({
  makeOptions,
  data,
  height,
  onReady,
}: {
  makeOptions: (width: number, height: number) => uPlot.Options;
  data: uPlot.AlignedData;
  height: number;
  /** Hands the chart to a caller that drives it (zoom, selection); null once it is gone. */
  onReady?: (chart: uPlot | null) => void;
}) {
  const container = useRef<HTMLDivElement>(null);
  const makeRef = useRef(makeOptions);
  makeRef.current = makeOptions;
  const readyRef = useRef(onReady);
  readyRef.current = onReady;

  useEffect(() => {
    const element = container.current;
    if (!element) return;
    const width = Math.max(280, element.clientWidth);
    const chart = new uPlot(makeRef.current(width, height), data, element);
    const observer = new ResizeObserver(([entry]) => {
      const next = Math.max(280, Math.floor(entry.contentRect.width));
      if (Math.abs(next - chart.width) > 1) chart.setSize({ width: next, height });
    });
    observer.observe(element);
    readyRef.current?.(chart);
    return () => {
      observer.disconnect();
      readyRef.current?.(null);
      chart.destroy();
    };
  }, [data, height]);

  return <div ref={container} className="w-full overflow-hidden" aria-hidden="true" />;
}
