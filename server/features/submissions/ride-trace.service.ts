import { rideTrace, type RideTrace } from '@shared/analysis/ride-trace';
import type { ComparisonResult } from '@shared/analysis/types';
import { AFTER_DRIVETRAIN_KINDS, type ModelKind } from '@shared/schemas/catalogue';
import type { RideTraceResponse } from '@shared/schemas/ride-trace';
import type { Db } from '../../db/knex';
import { NotFoundError } from '../../lib/errors';
import { decodeStream } from './stream-codec';
import { canSeeSubmission } from './submission.presenter';
import * as submissions from './submissions.repository';

interface Viewer {
  id: number;
  roles: string[];
}

/** The aligned traces of an analysed submission, for whoever may see the submission. */
export async function loadRideTrace(db: Db, id: number, viewer: Viewer | undefined): Promise<RideTraceResponse> {
  const submission = await submissions.findSubmission(db, id);
  if (!submission || !canSeeSubmission(viewer, submission)) throw new NotFoundError('No such submission, or it is not public yet.');
  const result = submission.result as ComparisonResult | null;
  const stored = await submissions.findForAnalysis(db, id);
  if (!result || !stored || stored.recordings.length !== 2) throw new NotFoundError('This submission has not been analysed yet.');
  const [a, b] = stored.recordings;
  const trace = rideTrace(
    decodeStream(a.stream),
    decodeStream(b.stream),
    {
      aPosition: a.position,
      bPosition: b.position,
      aAfterDrivetrain: AFTER_DRIVETRAIN_KINDS.includes(a.modelKind as ModelKind),
      bAfterDrivetrain: AFTER_DRIVETRAIN_KINDS.includes(b.modelKind as ModelKind),
    },
    result.alignment.clockOffsetSeconds,
  );
  return presentRideTrace(id, trace);
}

/** Allow-lists the trace's fields: seconds from the alignment start only, never clock time. */
function presentRideTrace(submissionId: number, trace: RideTrace): RideTraceResponse {
  return {
    submissionId,
    length: trace.length,
    aPower: trace.aPower,
    bPower: trace.bPower,
    aCadence: trace.aCadence,
    bCadence: trace.bCadence,
    aRightBalance: trace.aRightBalance,
    bRightBalance: trace.bRightBalance,
    matched: trace.matched,
  };
}
