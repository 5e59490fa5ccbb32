import type { Knex } from 'knex';
import { checkTags, tagMismatchFlags } from '@shared/analysis/tag-check';
import type { ComparisonResult, CompareOptions } from '@shared/analysis/types';
import { AFTER_DRIVETRAIN_KINDS, type ModelKind } from '@shared/schemas/catalogue';
import { compareStoredRecordings } from './recording-tasks';
import * as submissions from './submissions.repository';

/**
 * The per-ride comparison of a stored submission with the current method: the
 * engine's result (in a worker thread), plus the flags of the tag check (the
 * rider's firmware and recording-device tags against the files' own device data
 * and the catalogue). Throws the engine's AnalysisError when the recordings cannot
 * be compared.
 */
export async function compareStoredSubmission(db: Knex, recordings: submissions.StoredRecording[]): Promise<ComparisonResult> {
  const a = recordings.find((r) => r.side === 'a');
  const b = recordings.find((r) => r.side === 'b');
  if (!a || !b) throw new Error('a submission needs both recordings');
  const options: CompareOptions = {
    aPosition: a.position,
    bPosition: b.position,
    aAfterDrivetrain: AFTER_DRIVETRAIN_KINDS.includes(a.modelKind as ModelKind),
    bAfterDrivetrain: AFTER_DRIVETRAIN_KINDS.includes(b.modelKind as ModelKind),
  };
  // In a worker thread: a long pair takes seconds of CPU, which the web process's requests must not wait for.
  const result = await compareStoredRecordings(a.stream, b.stream, options);
  const tagFlags = [];
  for (const recording of [a, b]) {
    const catalogue = await submissions.findTagCatalogue(db, recording.modelId);
    tagFlags.push(...tagMismatchFlags(recording.side, checkTags(result.devices[recording.side], recording, catalogue)));
  }
  return { ...result, flags: [...tagFlags, ...result.flags] };
}
