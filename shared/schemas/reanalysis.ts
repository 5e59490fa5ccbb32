import { z } from 'zod';

// Re-analysis runs (issue 14): every stored submission analysed with an older
// method goes through the current one; admins start a run and watch its progress.

/** Where a run reads the rides from: the stored normalised streams, or (issue 20) the stored original files. */
export const REANALYSIS_SOURCES = ['streams', 'originals'] as const;
export type ReanalysisSource = (typeof REANALYSIS_SOURCES)[number];

export const REANALYSIS_STATUSES = ['running', 'finished', 'failed'] as const;
export type ReanalysisStatus = (typeof REANALYSIS_STATUSES)[number];

export const startReanalysisInput = z.strictObject({
  source: z.enum(REANALYSIS_SOURCES, { error: `one of ${REANALYSIS_SOURCES.join(', ')}` }).default('streams'),
});
export type StartReanalysisInput = z.infer<typeof startReanalysisInput>;

export const reanalysisRunView = z.object({
  id: z.number(),
  methodVersion: z.number(),
  source: z.enum(REANALYSIS_SOURCES),
  status: z.enum(REANALYSIS_STATUSES),
  startedBy: z.object({ handle: z.string(), name: z.string() }).nullable(),
  total: z.number(),
  done: z.number(),
  failed: z.number(),
  sentBack: z.number(),
  startedAt: z.string(),
  finishedAt: z.string().nullable(),
  lastError: z.string().nullable(),
});
export type ReanalysisRunView = z.infer<typeof reanalysisRunView>;

export const reanalysisOverview = z.object({
  /** The method a new run would use. */
  currentMethodVersion: z.number(),
  /** Stored submissions analysed with an older method: what a new run would re-analyse. */
  outdatedSubmissions: z.number(),
  /** Newest first. */
  runs: z.array(reanalysisRunView),
});
export type ReanalysisOverview = z.infer<typeof reanalysisOverview>;
