// npm run compare -- <a.fit> <b.fit> [--a-position left|right|dual|total] [--b-position …]
//   [--a-after-drivetrain] [--b-after-drivetrain] [--json]
// A is the device being judged, B its partner on the same ride. Exit code 2 on any error.
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { compareFitFiles } from '@shared/analysis/compare-recordings';
import { AnalysisError } from '@shared/analysis/errors';
import { MEASUREMENT_POSITIONS, type ComparisonResult, type MeasurementPosition } from '@shared/analysis/types';

const USAGE =
  'usage: npm run compare -- <a.fit> <b.fit> [--a-position left|right|dual|total] [--b-position …] [--a-after-drivetrain] [--b-after-drivetrain] [--json]';

class UsageError extends Error {
  readonly code: string;
  constructor(code: string, message: string) {
    super(message);
    this.code = code;
  }
}

function parsePosition(value: string | undefined, flag: string): MeasurementPosition {
  if (value === undefined) return 'total';
  if (!(MEASUREMENT_POSITIONS as readonly string[]).includes(value)) {
    throw new UsageError('invalid_position', `${flag} must be one of ${MEASUREMENT_POSITIONS.join(', ')}, not "${value}".`);
  }
  return value as MeasurementPosition;
}

function readFile(path: string): Uint8Array {
  try {
    return new Uint8Array(readFileSync(path));
  } catch {
    throw new UsageError('file_unreadable', `Cannot read the file "${path}".`);
  }
}

function parseCommandLine(argv: string[]) {
  try {
    return parseArgs({
      args: argv,
      allowPositionals: true,
      options: {
        'a-position': { type: 'string' },
        'b-position': { type: 'string' },
        'a-after-drivetrain': { type: 'boolean' },
        'b-after-drivetrain': { type: 'boolean' },
        json: { type: 'boolean' },
      },
    });
  } catch (error) {
    throw new UsageError('usage', `${(error as Error).message}\n${USAGE}`);
  }
}

function run(argv: string[]): { result: ComparisonResult; json: boolean } {
  const { values, positionals } = parseCommandLine(argv);
  if (positionals.length !== 2) throw new UsageError('usage', `Give exactly two FIT files.\n${USAGE}`);
  const options = {
    aPosition: parsePosition(values['a-position'], '--a-position'),
    bPosition: parsePosition(values['b-position'], '--b-position'),
    aAfterDrivetrain: values['a-after-drivetrain'] === true,
    bAfterDrivetrain: values['b-after-drivetrain'] === true,
  };
  return { result: compareFitFiles(readFile(positionals[0]), readFile(positionals[1]), options), json: values.json === true };
}

function signed(value: number | null, digits = 1, unit = ''): string {
  if (value === null) return '–';
  const text = value.toFixed(digits);
  return `${value > 0 && Number(text) !== 0 ? '+' : ''}${text}${unit}`;
}
const watts = (value: number | null) => (value === null ? '–' : `${value.toFixed(0)} W`);

function summary(result: ComparisonResult): string {
  const { alignment, bias, agreement, dropouts, likeForLike, peaks } = result;
  const lines = [
    `Crosswatt comparison (method v${result.methodVersion}): A = ${result.positions.a}, B = ${result.positions.b}`,
    `Alignment: A's clock ${signed(alignment.clockOffsetSeconds, 0, ' s')}, overlap ${(alignment.overlapSeconds / 60).toFixed(1)} min, correlation ${alignment.correlation.toFixed(3)}`,
    `Bias (A vs B, ${likeForLike.mode.replace('_', ' ')}${likeForLike.leg ? `, ${likeForLike.leg} leg` : ''}): ${signed(bias.percent, 2, ' %')} (${signed(bias.meanDifferenceWatts, 1, ' W')}) over ${bias.matchedSeconds} matched s`,
  ];
  if (likeForLike.mode === 'via_balance') lines.push(`  naive total vs total: ${signed(likeForLike.naivePercent, 2, ' %')}`);
  if (likeForLike.expectedDrivetrainPercent !== null)
    lines.push(`  expected from drivetrain loss alone: ${signed(likeForLike.expectedDrivetrainPercent, 1, ' %')}`);
  lines.push(
    `Agreement (${agreement.blockCount} blocks of ${agreement.blockSeconds} s): mean ${signed(agreement.meanDifferenceWatts, 1, ' W')}, limits ${signed(agreement.lowerLimitWatts, 1)} to ${signed(agreement.upperLimitWatts, 1, ' W')} (${signed(agreement.lowerLimitPercent, 1)} to ${signed(agreement.upperLimitPercent, 1, ' %')}); r ${agreement.pearsonR?.toFixed(3) ?? '–'}, CCC ${agreement.concordance?.toFixed(3) ?? '–'}`,
    `Dropouts over ${(dropouts.pedallingSeconds / 3600).toFixed(2)} pedalling h: A power ${dropouts.a.power.count} (${dropouts.a.power.seconds} s), cadence ${dropouts.a.cadence.count}; B power ${dropouts.b.power.count} (${dropouts.b.power.seconds} s), cadence ${dropouts.b.cadence.count}`,
    `Cadence lag: ${result.cadenceLagSeconds === null ? '–' : signed(result.cadenceLagSeconds, 0, ' s')} (positive: A trails B)`,
    `Average ${watts(peaks.averageWatts.a)} vs ${watts(peaks.averageWatts.b)}, normalised ${watts(peaks.normalisedWatts.a)} vs ${watts(peaks.normalisedWatts.b)}`,
    `Best efforts: ${peaks.best.map((peak) => `${peak.durationSeconds} s ${signed(peak.percent, 1, ' %')}`).join(', ')}; ${peaks.sprints.length} sprints`,
    `By power: ${result.powerBands.map((band) => `${band.label} ${signed(band.percent, 1, ' %')} (${band.matchedSeconds} s)`).join('; ')}`,
    `By cadence: ${result.cadenceBands.map((band) => `${band.label} ${signed(band.percent, 1, ' %')} (${band.matchedSeconds} s)`).join('; ')}`,
    `Steady segments: ${result.steadySegments.length}`,
  );
  lines.push(result.flags.length === 0 ? 'Flags: none' : 'Flags:');
  for (const flag of result.flags) lines.push(`  [${flag.severity}] ${flag.code}: ${flag.message}`);
  return lines.join('\n');
}

const wantsJson = process.argv.includes('--json');
try {
  const { result, json } = run(process.argv.slice(2));
  console.log(json ? JSON.stringify(result, null, 2) : summary(result));
} catch (error) {
  const known = error instanceof AnalysisError || error instanceof UsageError;
  const code = known ? error.code : 'internal_error';
  const message = known ? error.message : `Unexpected failure: ${(error as Error).message}`;
  if (wantsJson) console.log(JSON.stringify({ error: { code, message } }));
  else console.error(`error (${code}): ${message}`);
  process.exitCode = 2;
}
