import { z } from 'zod';

const reading = z.number().nullable();

/**
 * GET /api/submissions/:id/trace: both meters second by second on the aligned span.
 * Seconds count from the alignment start; no clock time, location or device identity.
 */
export const rideTraceResponse = z.object({
  submissionId: z.number().int(),
  length: z.number().int(),
  aPower: z.array(reading),
  bPower: z.array(reading),
  aCadence: z.array(reading),
  bCadence: z.array(reading),
  aRightBalance: z.array(reading),
  bRightBalance: z.array(reading),
  matched: z.array(z.union([z.literal(0), z.literal(1)])),
});
export type RideTraceResponse = z.infer<typeof rideTraceResponse>;
