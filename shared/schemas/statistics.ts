import { z } from 'zod';
import { boundedWholeNumber } from './fields';
import { MEASUREMENT_POSITIONS } from '../analysis/types';
import { MODEL_KINDS } from './catalogue';
import type { RateMethod } from '../statistics/clustered-rate';
import type { VerdictKind } from './battery';

// The shoppers' statistics: query parameters (validated at the edge and kept in the
// scoreboard's URL) and the figures the JSON endpoints return.

export const SCOREBOARD_SORTS = [
  'name',
  'maker',
  'evidence',
  'riders',
  'hours',
  'bias',
  'abs_bias',
  'scatter',
  'dropouts',
  'cadence_lag',
] as const;
export type ScoreboardSort = (typeof SCOREBOARD_SORTS)[number];

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `at most ${max} characters`)
    .optional()
    .transform((value) => (value ? value : undefined));

const filters = {
  position: z.enum(MEASUREMENT_POSITIONS).optional(),
  kind: z.enum(MODEL_KINDS).optional(),
  maker: optionalText(80),
  /** 'enough': only models past the minimum evidence (3 submissions, 3 riders). */
  evidence: z.enum(['any', 'enough']).default('any'),
  q: optionalText(80),
};

export const scoreboardQuery = z.object({
  ...filters,
  sort: z.enum(SCOREBOARD_SORTS).default('evidence'),
  order: z.enum(['asc', 'desc']).default('desc'),
  page: boundedWholeNumber(1, 10_000).default(1),
  pageSize: boundedWholeNumber(1, 100).default(25),
});
export type ScoreboardQuery = z.infer<typeof scoreboardQuery>;

export const scoreboardCsvQuery = z.object(filters);
export type ScoreboardCsvQuery = z.infer<typeof scoreboardCsvQuery>;

export const modelParams = z.object({ slug: z.string().trim().min(1).max(120) });
export const firmwareParams = modelParams.extend({ version: z.string().trim().min(1).max(60) });

/** The open licence of everything the CSV endpoints publish. */
export const OPEN_DATA_LICENCE = { name: 'CC BY 4.0', url: 'https://creativecommons.org/licenses/by/4.0/' } as const;

export interface RateFigure {
  events: number;
  perHour: number;
  lower: number;
  upper: number;
  /** Which interval: 'rider_clustered' when riders differ more than chance allows (it is then wider), else 'poisson_exact'. */
  method: RateMethod;
}

export interface RateRatioFigure {
  /** Null when neither group has an event, or the other group has none (no finite ratio). */
  ratio: number | null;
  lower: number;
  /** Null when unbounded. */
  upper: number | null;
  pValue: number;
  method: RateMethod;
}

export interface MeterFigures {
  evidence: { submissionCount: number; distinctRiders: number; pedallingHours: number; likeForLikeShare: number };
  /** False below the minimum evidence: every figure below is then null ("not enough data yet"). */
  enough: boolean;
  bias: {
    meanPercent: number;
    lowerPercent: number;
    upperPercent: number;
    standardErrorPercent: number;
    /** Riders − 1 at most (Satterthwaite's for unequal rider weights): the interval is between riders. */
    degreesOfFreedom: number;
    /** Riders whose rides give this bias (mixed comparisons give none). */
    riders: number;
    medianPercent: number | null;
    /** Between-submission SD: how consistent the meter is from ride to ride. */
    scatterPercent: number;
  } | null;
  agreement: { meanDifferencePercent: number; sdPercent: number; lowerPercent: number; upperPercent: number; blockCount: number } | null;
  powerDropouts: RateFigure | null;
  cadenceDropouts: RateFigure | null;
  medianCadenceLagSeconds: number | null;
  sprints: { count: number; meanPeakPercent: number | null; meanRiseSecondsVsPartner: number | null } | null;
}

export interface ConsensusFigure {
  offsetPercent: number;
  lowerPercent: number | null;
  upperPercent: number | null;
  connectedTo: number;
}

export interface ScoreboardRow {
  slug: string;
  name: string;
  maker: { slug: string; name: string };
  position: (typeof MEASUREMENT_POSITIONS)[number];
  kind: (typeof MODEL_KINDS)[number];
  latestFirmware: { version: string; releasedOn: string | null } | null;
  figures: MeterFigures;
}

export interface ScoreboardPage {
  rows: ScoreboardRow[];
  total: number;
  page: number;
  pageSize: number;
  sort: ScoreboardSort;
  order: 'asc' | 'desc';
}

/** A measure's verdict: its p-value Holm-adjusted over every test on the model's firmware page. */
export interface ComparisonJudgement {
  adjustedPValue: number | null;
  verdict: VerdictKind;
}

export interface FirmwareComparison {
  from: string;
  to: string;
  /** Power dropouts per hour of `to` against `from`: rider-clustered rates, never narrower than the exact conditional test. */
  powerDropoutRatio: (RateRatioFigure & ComparisonJudgement) | null;
  /** Rider-level mean bias of `to` minus `from`, Welch's t-test on the two rider-level means. */
  biasDifference:
    | ({
        differencePercent: number;
        lowerPercent: number;
        upperPercent: number;
        pValue: number;
        degreesOfFreedom: number;
      } & ComparisonJudgement)
    | null;
  /** The step in one word: worse when either measure is worse, better when one is better and none worse. */
  verdict: VerdictKind;
  /** The verdict in words for shoppers, e.g. "Fewer power dropouts than 1.2; no clear change in bias." */
  words: string;
}

export interface DropoutBreakdownRow {
  tag: 'surface' | 'environment' | 'recording_device' | 'recording_mode' | 'other_meters_on';
  value: string;
  label: string;
  submissionCount: number;
  pedallingHours: number;
  enough: boolean;
  powerDropouts: RateFigure | null;
  /** This value's power dropout rate against all other submissions of the scope. */
  againstRest: RateRatioFigure | null;
}

export interface RecentSubmission {
  id: number;
  rideMonth: string;
  firmware: string;
  side: 'a' | 'b';
  partner: { modelSlug: string; modelName: string; makerName: string; firmware: string };
  biasPercent: number | null;
  pedallingHours: number;
  powerDropouts: number;
}

export interface FirmwareSummary {
  version: string;
  releasedOn: string | null;
  beta: boolean;
  figures: MeterFigures;
  consensus: ConsensusFigure | null;
  againstPredecessor: FirmwareComparison | null;
}

export interface ModelHeader {
  slug: string;
  name: string;
  maker: { slug: string; name: string };
  position: ScoreboardRow['position'];
  kind: ScoreboardRow['kind'];
  hiddenReason: string | null;
  threadsPath: string;
}

/** Which comparison methods a page's figures come from (issue 14): the current one, and those of the accepted rides counted. */
export interface FigureMethods {
  current: number;
  /** Distinct method versions of the accepted rides in the figures, ascending; empty without any. */
  versions: number[];
}

export interface ModelPage {
  model: ModelHeader;
  /** The consensus offsets shown: the day they were fitted (null before the first fit; a day, like every public time). */
  consensusFittedOn: string | null;
  /** A like-for-like decision came after that fit: a worker refits within seconds. */
  consensusRefitPending: boolean;
  methods: FigureMethods;
  note: { body: string; pinnedAt: string } | null;
  figures: MeterFigures;
  firmware: FirmwareSummary[];
  dropoutBreakdown: DropoutBreakdownRow[];
  recentSubmissions: RecentSubmission[];
}

export interface FirmwarePage {
  model: ModelHeader;
  /** As on ModelPage. */
  consensusFittedOn: string | null;
  consensusRefitPending: boolean;
  methods: FigureMethods;
  firmware: FirmwareSummary;
  note: { body: string; pinnedAt: string } | null;
  dropoutBreakdown: DropoutBreakdownRow[];
  submissions: RecentSubmission[];
}
