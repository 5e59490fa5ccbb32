// Runs in a worker thread of the fuzzer (fit-fuzz-campaign.ts): one mutant through
// exactly what an upload and its analysis run (the server's recording tasks), or
// through the FIT SDK's Decoder beside our reader. Typed refusals are answers;
// anything else thrown is reported as untyped, with its stack.
import { readRideStream } from '@shared/analysis/decode-fit';
import { AnalysisError, type AnalysisErrorCode } from '@shared/analysis/errors';
import type { CompareOptions, RideStream, Side } from '@shared/analysis/types';
import runRecordingTask, { type PreparedRecording } from '../../server/features/submissions/recording-tasks.worker';
import { type ReferenceRecords, readWithFitSdk } from './fit-sdk-reference';

export type FuzzTask =
  | { kind: 'engine'; mutant: Uint8Array; mutantSide: Side; partner: Uint8Array; partnerName: string; options: CompareOptions }
  | { kind: 'reference'; mutant: Uint8Array };

export type EngineVerdict =
  | { outcome: 'accepted' }
  | { outcome: 'refused'; code: AnalysisErrorCode }
  | { outcome: 'untyped'; error: string };

export interface ReferenceVerdict {
  /** The SDK's integrity check passed and it read the file without error. */
  sdkReadable: boolean;
  /** Records with a timestamp and a power value, as the SDK reads them. */
  sdkPowerRecords: number;
  /** Our reader (before the usability checks): 'read', its refusal code, or 'untyped'. */
  ours: 'read' | AnalysisErrorCode | 'untyped';
  /** When both read the file: the first difference between the two streams, or null. */
  difference: string | null;
}

// The partner is the same for thousands of mutants: prepared once per thread.
const preparedPartners = new Map<string, PreparedRecording>();

export default function runFuzzTask(task: FuzzTask): EngineVerdict | ReferenceVerdict {
  return task.kind === 'engine' ? engine(task) : reference(task.mutant);
}

function engine(task: Extract<FuzzTask, { kind: 'engine' }>): EngineVerdict {
  try {
    const mutant = runRecordingTask({ kind: 'prepare', bytes: task.mutant });
    if (!mutant.ok) return { outcome: 'refused', code: mutant.error.code };
    const partner = preparedPartner(task);
    const stored = { [task.mutantSide]: (mutant.value as PreparedRecording).stored, [task.mutantSide === 'a' ? 'b' : 'a']: partner.stored };
    const compared = runRecordingTask({ kind: 'compare', a: stored.a!, b: stored.b!, options: task.options });
    return compared.ok ? { outcome: 'accepted' } : { outcome: 'refused', code: compared.error.code };
  } catch (err) {
    return { outcome: 'untyped', error: err instanceof Error ? (err.stack ?? `${err.name}: ${err.message}`) : String(err) };
  }
}

function preparedPartner(task: Extract<FuzzTask, { kind: 'engine' }>): PreparedRecording {
  let prepared = preparedPartners.get(task.partnerName);
  if (!prepared) {
    const outcome = runRecordingTask({ kind: 'prepare', bytes: task.partner });
    if (!outcome.ok) throw new Error(`the unmutated partner ${task.partnerName} was refused: ${outcome.error.message}`);
    prepared = outcome.value as PreparedRecording;
    preparedPartners.set(task.partnerName, prepared);
  }
  return prepared;
}

function reference(bytes: Uint8Array): ReferenceVerdict {
  let sdk: ReturnType<typeof readWithFitSdk>;
  try {
    sdk = readWithFitSdk(bytes);
  } catch (err) {
    sdk = { readable: false, reason: String(err) };
  }
  let ours: ReferenceVerdict['ours'] = 'read';
  let stream: RideStream | null = null;
  try {
    stream = readRideStream(bytes);
  } catch (err) {
    ours = err instanceof AnalysisError ? err.code : 'untyped';
  }
  const records = sdk.readable ? sdk.records : null;
  return {
    sdkReadable: sdk.readable,
    sdkPowerRecords: records ? records.power.filter((watts) => !Number.isNaN(watts)).length : 0,
    ours,
    difference: records && stream ? firstDifference(stream, records) : null,
  };
}

function firstDifference(ours: RideStream, sdk: ReferenceRecords): string | null {
  if (ours.timestamps.length !== sdk.timestamps.length)
    return `${ours.timestamps.length} records against the SDK's ${sdk.timestamps.length}`;
  // Our value columns are single precision by design (decode-fit.ts): the SDK's values are rounded alike.
  const single = (values: number[]) => values.map(Math.fround);
  const columns: Array<[name: string, ours: ArrayLike<number>, sdk: number[]]> = [
    ['timestamp', ours.timestamps, sdk.timestamps],
    ['power', ours.powerWatts, single(sdk.power)],
    ['cadence', ours.cadenceRpm, single(sdk.cadence)],
    ['balance', ours.rightBalancePercent, single(sdk.rightBalance)],
  ];
  for (const [name, mine, theirs] of columns) {
    for (let i = 0; i < theirs.length; i++) {
      if (mine[i] !== theirs[i] && !(Number.isNaN(mine[i]) && Number.isNaN(theirs[i])))
        return `record ${i}: ${name} ${mine[i]} against the SDK's ${theirs[i]}`;
    }
  }
  return null;
}
