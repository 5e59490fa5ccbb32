import { Link } from 'react-router-dom';
import type { FirmwareComparison, FirmwareSummary } from '@shared/schemas/statistics';
import { NotEnoughData } from '@/components/ui/not-enough-data';
import { percentPlusMinus, plain, pValue, perHour, ratio, signedPercent } from '@/lib/format-figures';

export function FirmwareComparisonTable({ modelSlug, firmware }: { modelSlug: string; firmware: FirmwareSummary[] }) {
  return (
    <div className="overflow-x-auto rounded-card border border-paper-line bg-white shadow-card">
      <table className="w-full text-left text-body">
        <caption className="sr-only">Each firmware version against its predecessor</caption>
        <thead className="border-b border-paper-line bg-paper-deep/60 text-caption uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="px-4 py-3">
              Firmware
            </th>
            <th scope="col" className="px-4 py-3">
              Rides
            </th>
            <th scope="col" className="px-4 py-3">
              Bias (95 %)
            </th>
            <th scope="col" className="px-4 py-3">
              Power dropouts
            </th>
            <th scope="col" className="px-4 py-3">
              Dropouts vs previous
            </th>
            <th scope="col" className="px-4 py-3">
              Bias change vs previous
            </th>
            <th scope="col" className="px-4 py-3">
              Verdict
            </th>
          </tr>
        </thead>
        <tbody>
          {[...firmware].reverse().map((f) => {
            const c = f.againstPredecessor;
            return (
              <tr key={f.version} className="border-b border-paper-line/70 last:border-0">
                <th scope="row" className="px-4 py-3 font-medium">
                  <Link to={`/models/${modelSlug}/firmware/${encodeURIComponent(f.version)}`} className="text-fjord-700 hover:underline">
                    {f.version}
                  </Link>
                  {f.beta && <span className="ml-2 rounded-full bg-caution-100 px-2 text-caption text-caution-600">beta</span>}
                  {f.releasedOn && <div className="text-caption text-ink-faint">released {f.releasedOn}</div>}
                </th>
                <td className="px-4 py-3 tabular-nums">{f.figures.evidence.submissionCount}</td>
                <td className="px-4 py-3 tabular-nums">
                  {f.figures.bias ? (
                    percentPlusMinus(f.figures.bias.meanPercent, f.figures.bias.lowerPercent, f.figures.bias.upperPercent)
                  ) : (
                    <NotEnoughData riders />
                  )}
                </td>
                <td className="px-4 py-3 tabular-nums">
                  {f.figures.powerDropouts ? perHour(f.figures.powerDropouts.perHour) : <NotEnoughData riders />}
                </td>
                <td className="px-4 py-3 tabular-nums">
                  {!c ? (
                    '—'
                  ) : c.powerDropoutRatio ? (
                    <>
                      {ratio(c.powerDropoutRatio.ratio, c.powerDropoutRatio.lower, c.powerDropoutRatio.upper)}
                      <div className="text-caption text-ink-faint">
                        vs {c.from}, {pValue(c.powerDropoutRatio.pValue)}
                        {c.powerDropoutRatio.adjustedPValue !== null && <>, adjusted {pValue(c.powerDropoutRatio.adjustedPValue)}</>}
                      </div>
                    </>
                  ) : (
                    <NotEnoughData riders />
                  )}
                </td>
                <td className="px-4 py-3 tabular-nums">
                  {!c ? (
                    '—'
                  ) : c.biasDifference ? (
                    <>
                      {signedPercent(c.biasDifference.differencePercent)} ({plain(c.biasDifference.lowerPercent, 1)} to{' '}
                      {plain(c.biasDifference.upperPercent, 1)})
                      <div className="text-caption text-ink-faint">
                        vs {c.from}, Welch {pValue(c.biasDifference.pValue)}
                        {c.biasDifference.adjustedPValue !== null && <>, adjusted {pValue(c.biasDifference.adjustedPValue)}</>}
                      </div>
                    </>
                  ) : (
                    <NotEnoughData riders />
                  )}
                </td>
                <td className="px-4 py-3">{c ? <VerdictWords verdict={c.verdict} words={c.words} /> : '—'}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

const VERDICT_TONE: Record<FirmwareComparison['verdict'], string> = {
  better: 'text-fjord-700 font-medium',
  worse: 'text-caution-600 font-medium',
  no_clear_difference: 'text-ink-soft',
  not_enough: 'text-ink-faint italic',
};

/** The step's verdict in words, beside the numbers (p-values Holm-adjusted over the page). */
function VerdictWords({ verdict, words }: Pick<FirmwareComparison, 'verdict' | 'words'>) {
  return <span className={`text-caption ${VERDICT_TONE[verdict]}`}>{words}</span>;
}
