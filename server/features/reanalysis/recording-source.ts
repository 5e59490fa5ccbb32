import type { Knex } from 'knex';
import type { ReanalysisSource } from '@shared/schemas/reanalysis';
import { AppError } from '../../lib/errors';
import { findStoredRecordings, type StoredRecording } from '../submissions/submissions.repository';

/** A run asked for a source this server cannot read yet (the stored original files come with issue 20). */
export class ReanalysisSourceUnavailableError extends AppError {
  constructor(readonly source: ReanalysisSource) {
    super(400, 'reanalysis_source_unavailable', `Re-analysis from the stored ${source} is not available yet; use the stored streams.`, { source });
  }
}

const AVAILABLE_SOURCES: readonly ReanalysisSource[] = ['streams'];

export function assertSourceAvailable(source: ReanalysisSource): void {
  if (!AVAILABLE_SOURCES.includes(source)) throw new ReanalysisSourceUnavailableError(source);
}

/**
 * The two recordings of a submission as the comparison reads them, from the
 * run's source. The one place a re-analysis loads rides, so the original files
 * (issue 20) can be wired in here.
 */
export async function loadRecordingsForReanalysis(db: Knex, submissionId: number, source: ReanalysisSource): Promise<StoredRecording[]> {
  assertSourceAvailable(source);
  return findStoredRecordings(db, submissionId);
}
