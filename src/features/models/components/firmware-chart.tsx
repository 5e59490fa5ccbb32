import type { FirmwareSummary } from '@shared/schemas/statistics';

// Stacked panels over the firmware versions in release order: bias against
// partners, power and cadence dropouts per hour, each a dot with its 95 % interval.
// Versions without enough evidence keep their place and are marked as such.
const WIDTH = 640;
const PANEL = 130;
const LEFT = 64;
const RIGHT = 16;

interface Point {
  value: number;
  lower: number;
  upper: number;
}

function Panel({
  title,
  unit,
  points,
  labels,
  top,
  zeroLine,
  tone,
}: {
  title: string;
  unit: string;
  points: (Point | null)[];
  labels: string[];
  top: number;
  zeroLine: boolean;
  tone: 'ember' | 'fjord';
}) {
  const known = points.filter((p): p is Point => p !== null);
  let min = Math.min(zeroLine ? 0 : 0, ...known.map((p) => p.lower));
  let max = Math.max(zeroLine ? 0 : 0.1, ...known.map((p) => p.upper));
  if (max - min < 1e-6) max = min + 1;
  const pad = (max - min) * 0.1;
  min -= zeroLine ? pad : 0;
  max += pad;
  const step = (WIDTH - LEFT - RIGHT) / Math.max(1, labels.length);
  const x = (i: number) => LEFT + step * (i + 0.5);
  const y = (v: number) => top + 20 + (1 - (v - min) / (max - min)) * (PANEL - 30);
  const stroke = tone === 'ember' ? 'stroke-ember-500' : 'stroke-fjord-500';
  const fill = tone === 'ember' ? 'fill-ember-700' : 'fill-fjord-700';
  return (
    <g>
      <text x={LEFT} y={top + 10} className="fill-ink text-[12px] font-semibold">
        {title}
      </text>
      {[min, (min + max) / 2, max].map((tick) => (
        <g key={tick}>
          <line x1={LEFT} x2={WIDTH - RIGHT} y1={y(tick)} y2={y(tick)} className="stroke-paper-line" strokeWidth="1" />
          <text x={LEFT - 6} y={y(tick) + 4} textAnchor="end" className="fill-ink-faint text-[10px]">
            {tick.toFixed(Math.abs(max - min) < 1 ? 2 : 1)}
            {unit}
          </text>
        </g>
      ))}
      {zeroLine && (
        <line x1={LEFT} x2={WIDTH - RIGHT} y1={y(0)} y2={y(0)} className="stroke-ink-faint" strokeDasharray="3 3" strokeWidth="1" />
      )}
      {points.map((point, i) =>
        point ? (
          <g key={labels[i]}>
            <line
              x1={x(i)}
              x2={x(i)}
              y1={y(point.lower)}
              y2={y(point.upper)}
              className={stroke}
              strokeWidth="6"
              strokeLinecap="round"
              opacity="0.35"
            />
            <circle cx={x(i)} cy={y(point.value)} r="4.5" className={fill} />
          </g>
        ) : (
          <text key={labels[i]} x={x(i)} y={top + PANEL / 2 + 10} textAnchor="middle" className="fill-ink-faint text-[10px] italic">
            not enough data
          </text>
        ),
      )}
    </g>
  );
}

export function FirmwareChart({ firmware }: { firmware: FirmwareSummary[] }) {
  const labels = firmware.map((f) => f.version);
  const bias = firmware.map((f) =>
    f.figures.bias ? { value: f.figures.bias.meanPercent, lower: f.figures.bias.lowerPercent, upper: f.figures.bias.upperPercent } : null,
  );
  const rate = (figure: FirmwareSummary['figures']['powerDropouts']) =>
    figure ? { value: figure.perHour, lower: figure.lower, upper: figure.upper } : null;
  const powerDropouts = firmware.map((f) => rate(f.figures.powerDropouts));
  const cadenceDropouts = firmware.map((f) => rate(f.figures.cadenceDropouts));
  const step = (WIDTH - LEFT - RIGHT) / Math.max(1, labels.length);
  const height = PANEL * 3 + 50;
  const summary = firmware
    .map((f) => `${f.version}: ${f.figures.bias ? `bias ${f.figures.bias.meanPercent.toFixed(1)} %` : 'not enough data'}`)
    .join('; ');
  return (
    <figure className="rounded-card border border-paper-line bg-white p-4 shadow-card">
      <svg
        viewBox={`0 0 ${WIDTH} ${height}`}
        className="w-full"
        role="img"
        aria-label={`Bias, power and cadence dropouts by firmware version. ${summary}`}
      >
        <Panel title="Bias against partners" unit=" %" points={bias} labels={labels} top={0} zeroLine tone="ember" />
        <Panel
          title="Power dropouts per hour"
          unit=""
          points={powerDropouts}
          labels={labels}
          top={PANEL + 10}
          zeroLine={false}
          tone="fjord"
        />
        <Panel
          title="Cadence dropouts per hour"
          unit=""
          points={cadenceDropouts}
          labels={labels}
          top={2 * (PANEL + 10)}
          zeroLine={false}
          tone="fjord"
        />
        {labels.map((label, i) => (
          <text key={label} x={LEFT + step * (i + 0.5)} y={height - 6} textAnchor="middle" className="fill-ink-soft text-[11px]">
            {label}
          </text>
        ))}
      </svg>
      <figcaption className="mt-2 text-caption text-ink-soft">
        Dots are the estimates, bars their 95 % intervals. Firmware in release order.
      </figcaption>
    </figure>
  );
}
