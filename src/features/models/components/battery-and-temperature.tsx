import type { BatteryLifeFigure, FirmwareBatteryLife, ModelConditions, TemperatureBandFigure, VerdictKind } from '@shared/schemas/battery';
import { NotEnoughData } from '@/components/ui/not-enough-data';
import { percentPlusMinus, pValue } from '@/lib/format-figures';
import { useModelConditions } from '../api/get-model-conditions';

const VERDICT_STYLE: Record<VerdictKind, string> = {
  better: 'bg-moss-100 text-moss-700',
  worse: 'bg-alert-100 text-alert-800',
  no_clear_difference: 'bg-paper-deep text-ink-soft',
  not_enough: 'text-ink-faint italic',
};

const wholeHours = (value: number) => `${Math.round(value).toLocaleString('en-GB')} h`;

/** "310 h (95 %: 240 to 420 h)", or "more than 120 h" while fewer than half have run flat. */
function lifeText(life: BatteryLifeFigure): string {
  if (life.medianHours === null) return `more than ${wholeHours(life.longestFollowedHours)} (fewer than half have run flat)`;
  const upper = life.upperHours === null ? 'not bounded yet' : wholeHours(life.upperHours);
  return `${wholeHours(life.medianHours)} (95 %: ${life.lowerHours === null ? '–' : wholeHours(life.lowerHours)} to ${upper})`;
}

function evidence(life: BatteryLifeFigure): string {
  const running = life.batteries - life.ranFlat;
  return `${life.batteries} ${life.batteries === 1 ? 'battery' : 'batteries'} of ${life.riders} ${life.riders === 1 ? 'rider' : 'riders'}, ${life.ranFlat} ran flat, ${running} still running or changed early`;
}

function BatteryHeadline({
  life,
  claim,
  minimums,
}: {
  life: BatteryLifeFigure;
  claim: ModelConditions['claim'];
  minimums: ModelConditions['minimums'];
}) {
  return (
    <div className="rounded-card border border-paper-line bg-white p-5 shadow-card">
      <p className="text-caption font-semibold uppercase tracking-wide text-ink-soft">Median hours of riding per battery</p>
      {life.enough ? (
        <p className="mt-1 text-lead font-semibold tabular-nums text-ink" data-testid="battery-median">
          {lifeText(life)}
        </p>
      ) : (
        <p className="mt-1 text-ink-soft" data-testid="battery-median">
          Not enough batteries yet: a figure needs {minimums.batteries} batteries from {minimums.batteryRiders} riders.
        </p>
      )}
      <p className="mt-1 text-caption text-ink-faint">{evidence(life)}</p>
      <p className="mt-3 text-body text-ink-soft" data-testid="battery-claim">
        {claim ? (
          <>
            The maker claims <span className="font-semibold text-ink">{wholeHours(claim.hours)}</span>{' '}
            <span className="text-caption text-ink-faint">(source: {claim.source})</span>
          </>
        ) : (
          'No claim from the maker entered yet.'
        )}
      </p>
    </div>
  );
}

function BatteryByFirmware({ firmware }: { firmware: FirmwareBatteryLife[] }) {
  return (
    <div className="overflow-x-auto rounded-card border border-paper-line bg-white shadow-card">
      <table className="w-full text-left text-body">
        <caption className="sr-only">Battery life for each firmware version, against its predecessor</caption>
        <thead className="border-b border-paper-line bg-paper-deep/60 text-caption uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="px-4 py-3">
              Firmware
            </th>
            <th scope="col" className="px-4 py-3">
              Batteries (riders)
            </th>
            <th scope="col" className="px-4 py-3">
              Median per battery
            </th>
            <th scope="col" className="px-4 py-3">
              Against the previous version
            </th>
          </tr>
        </thead>
        <tbody>
          {[...firmware].reverse().map((f) => (
            <tr key={f.version} className="border-b border-paper-line/70 last:border-0">
              <th scope="row" className="px-4 py-3 font-medium">
                {f.version}
              </th>
              <td className="px-4 py-3 tabular-nums">
                {f.life.batteries} ({f.life.riders})
              </td>
              <td className="px-4 py-3 tabular-nums">{f.life.enough ? lifeText(f.life) : <NotEnoughData />}</td>
              <td className="px-4 py-3">
                {f.againstPredecessor ? (
                  <>
                    <span className={`rounded-full px-2.5 py-0.5 text-caption font-medium ${VERDICT_STYLE[f.againstPredecessor.verdict]}`}>
                      {f.againstPredecessor.words}
                    </span>
                    {f.againstPredecessor.adjustedPValue !== null && (
                      <div className="mt-1 text-caption text-ink-faint">
                        log-rank over riders, {pValue(f.againstPredecessor.adjustedPValue)} after Holm's adjustment
                      </div>
                    )}
                  </>
                ) : (
                  <span className="text-caption text-ink-faint">first version logged</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function TemperatureTable({ bands, minimumRiders }: { bands: TemperatureBandFigure[]; minimumRiders: number }) {
  const seen = bands.filter((b) => b.rides > 0);
  if (seen.length === 0) return <p className="text-ink-soft">No accepted ride of this meter carries the head unit's temperature yet.</p>;
  return (
    <div className="overflow-x-auto rounded-card border border-paper-line bg-white shadow-card">
      <table className="w-full text-left text-body">
        <caption className="sr-only">Bias of this meter against its partners in each temperature band</caption>
        <thead className="border-b border-paper-line bg-paper-deep/60 text-caption uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="px-4 py-3">
              Head unit temperature
            </th>
            <th scope="col" className="px-4 py-3">
              Rides (riders)
            </th>
            <th scope="col" className="px-4 py-3">
              Hours
            </th>
            <th scope="col" className="px-4 py-3">
              Bias (95 %, over riders)
            </th>
          </tr>
        </thead>
        <tbody>
          {seen.map((b) => (
            <tr key={b.band} className="border-b border-paper-line/70 last:border-0">
              <th scope="row" className="px-4 py-3 font-medium">
                {b.band}
              </th>
              <td className="px-4 py-3 tabular-nums">
                {b.rides} ({b.riders})
              </td>
              <td className="px-4 py-3 tabular-nums">{b.hours.toFixed(1)}</td>
              <td className="px-4 py-3 tabular-nums">
                {b.meanPercent !== null && b.lowerPercent !== null && b.upperPercent !== null ? (
                  percentPlusMinus(b.meanPercent, b.lowerPercent, b.upperPercent)
                ) : (
                  <span className="text-caption italic text-ink-faint">needs {minimumRiders} riders</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/**
 * Battery life (riders' logs, batteries still running counted as such) and the bias per
 * temperature band, for a model or, with `version`, one of its firmware versions.
 */
export function BatteryAndTemperature({ modelSlug, version }: { modelSlug: string; version?: string }) {
  const conditions = useModelConditions(modelSlug);
  if (conditions.isPending) return <p className="text-ink-soft">Loading…</p>;
  if (conditions.isError)
    return (
      <p role="alert" className="text-alert-800">
        {conditions.error.message}
      </p>
    );
  const c = conditions.data;
  const one = version === undefined ? undefined : c.firmware.find((f) => f.version === version);
  const life = one ? one.life : c.batteryLife;
  const bands = version === undefined ? c.temperature.all : (c.temperature.firmware.find((f) => f.version === version)?.bands ?? []);
  return (
    <div className="space-y-6" data-testid="battery-and-temperature">
      <div className="grid gap-4 md:grid-cols-[minmax(0,22rem)_1fr] md:items-start">
        <BatteryHeadline life={life} claim={c.claim} minimums={c.minimums} />
        {one?.againstPredecessor ? (
          <p className="rounded-card border border-paper-line bg-white p-5 shadow-card" data-testid="battery-verdict">
            <span className={`rounded-full px-2.5 py-0.5 font-medium ${VERDICT_STYLE[one.againstPredecessor.verdict]}`}>
              {one.againstPredecessor.words}
            </span>
          </p>
        ) : version === undefined && c.batteryLife.batteries > 0 ? (
          <BatteryByFirmware firmware={c.firmware} />
        ) : null}
      </div>
      <p className="max-w-3xl text-caption text-ink-faint">
        Hours come from riders' logs: the rides they submitted with the meter, and riding they added by hand. Batteries still running count
        as "at least this long". Battery life depends on temperature, storage and the cell; follow the maker's instructions for the battery
        type and how to change it.
      </p>
      <div>
        <h3 className="mb-2 font-semibold text-ink">Bias by temperature</h3>
        <TemperatureTable bands={bands} minimumRiders={c.minimums.temperatureRiders} />
      </div>
    </div>
  );
}
