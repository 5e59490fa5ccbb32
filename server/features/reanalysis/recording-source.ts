import type { Knex } from 'knex';
import { DECODER_VERSION } from '@shared/analysis/decode-fit';
import type { ReanalysisSource } from '@shared/schemas/reanalysis';
import type { ObjectStore } from '../../lib/object-store';
import { fetchOriginal } from '../originals/originals.service';
import { prepareRecording } from '../submissions/recording-tasks';
import { findStoredRecordings, type StoredRecording } from '../submissions/submissions.repository';

export interface ReanalysisRecording extends StoredRecording {
  /** Decoded again from the kept original with the current decoder: its stream replaces the stored one. */
  redecoded: boolean;
}

/** A recording whose kept original a newer decoder would read again. */
export function decodesAgain(recording: Pick<StoredRecording, 'originalKey' | 'decoderVersion'>): boolean {
  return recording.originalKey !== null && (recording.decoderVersion ?? 0) < DECODER_VERSION;
}

/**
 * The two recordings of a submission as the comparison reads them, from the run's
 * source: the stored streams; or, from the originals, each recording with a kept
 * original (location removed) that an older decoder built is decoded again in the
 * worker pool, and the others keep their streams (older uploads have no original).
 * The one place a re-analysis loads rides.
 */
export async function loadRecordingsForReanalysis(
  db: Knex,
  submissionId: number,
  source: ReanalysisSource,
  store?: ObjectStore,
): Promise<ReanalysisRecording[]> {
  const recordings = await findStoredRecordings(db, submissionId);
  if (source === 'streams' || !store) return recordings.map((r) => ({ ...r, redecoded: false }));
  return Promise.all(
    recordings.map(async (recording) => {
      if (!decodesAgain(recording)) return { ...recording, redecoded: false };
      const prepared = await prepareRecording(await fetchOriginal(store, recording.originalKey!));
      return { ...recording, stream: prepared.stored, decoderVersion: DECODER_VERSION, redecoded: true };
    }),
  );
}
