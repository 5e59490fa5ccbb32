/** Where a power meter measures: one leg, both legs independently, or the total (spider, spindle, hub, trainer). */
export type MeasurementPosition = 'left' | 'right' | 'dual' | 'total';

export const MEASUREMENT_POSITIONS: readonly MeasurementPosition[] = ['left', 'right', 'dual', 'total'];

export type Side = 'a' | 'b';

export interface DeviceIdentity {
  manufacturerId: number | null;
  productId: number | null;
  serialNumber: number | null;
  softwareVersion: number | null;
}

export interface DeviceInfo {
  /** The unit that wrote the file (FIT file_id). */
  creator: DeviceIdentity;
  /** The power sensor, when the file lists it among its devices (device_info of type bike power). */
  powerMeter: DeviceIdentity | null;
}

/** One device_info message of the power meter, as the file gave it (battery and wear over the ride). */
export interface PowerMeterReport {
  /** UTC seconds; null when the message carries no time. */
  time: number | null;
  /** FIT battery_status: 1 new, 2 good, 3 ok, 4 low, 5 critical, 6 charging, 7 unknown (FIT SDK profile). */
  batteryStatus: number | null;
  /** battery_voltage in volts (the file stores 1/256 V). */
  batteryVolts: number | null;
  /** cum_operating_time: the sensor's total running time, in seconds. */
  cumulativeOperatingSeconds: number | null;
}

export interface RecordingStatistics {
  recordCount: number;
  /** UTC seconds of the first and last record. */
  startTime: number;
  endTime: number;
  medianIntervalSeconds: number;
  /** Gaps longer than the timeline's carry-forward limit: they become "no data". */
  longGapCount: number;
  longGapSeconds: number;
}

/**
 * One device's recording, normalised. Arrays are parallel, one entry per record;
 * NaN means the record does not carry the value.
 */
export interface RideStream {
  /** UTC seconds (Unix epoch). */
  timestamps: Float64Array;
  // Single precision holds every value a FIT record can carry in these fields exactly
  // (whole watts up to 65,534, rpm, percent, °C) at half the memory of a double.
  powerWatts: Float32Array;
  cadenceRpm: Float32Array;
  /** The right leg's share of total power in percent; NaN when absent or the side is unknown. */
  rightBalancePercent: Float32Array;
  /** Record temperature in °C, parallel to timestamps; present only when the file records it. */
  temperatureCelsius?: Float32Array;
  device: DeviceInfo;
  /** Every device_info message of the power meter, in file order (set by the decoder). */
  powerMeterReports?: PowerMeterReport[];
  recording: RecordingStatistics;
}

export type FlagSeverity = 'info' | 'warning' | 'severe';

export interface QualityFlag {
  code: string;
  severity: FlagSeverity;
  message: string;
}

export interface CompareOptions {
  aPosition: MeasurementPosition;
  bPosition: MeasurementPosition;
  /** Hubs and trainers measure after the chain, so they read lower by the drivetrain loss. */
  aAfterDrivetrain?: boolean;
  bAfterDrivetrain?: boolean;
}

export interface Alignment {
  /** Seconds A's timestamps run ahead of B's: A stamps at T + offset what B stamps at T. */
  clockOffsetSeconds: number;
  /** Method 2: the best offset lies outside the search window, so the comparison is not of one moment. */
  outsideWindow?: boolean;
  overlapSeconds: number;
  correlation: number;
  /** UTC seconds, on B's clock, of the first and one past the last shared second. */
  startTime: number;
  endTime: number;
}

export interface Bias {
  percent: number | null;
  meanDifferenceWatts: number | null;
  matchedSeconds: number;
}

export interface AgreementBlock {
  /** Seconds from the alignment start. */
  startSeconds: number;
  aWatts: number;
  bWatts: number;
}

export interface Agreement {
  blockSeconds: number;
  blockCount: number;
  meanDifferenceWatts: number | null;
  sdWatts: number | null;
  lowerLimitWatts: number | null;
  upperLimitWatts: number | null;
  meanDifferencePercent: number | null;
  sdPercent: number | null;
  lowerLimitPercent: number | null;
  upperLimitPercent: number | null;
  pearsonR: number | null;
  concordance: number | null;
  deming: { slope: number; intercept: number } | null;
  blocks: AgreementBlock[];
}

export interface DropoutEvent {
  /** Seconds from the alignment start; end is exclusive. */
  startSeconds: number;
  endSeconds: number;
  durationSeconds: number;
}

export interface DropoutSummary {
  count: number;
  seconds: number;
  ratePerHour: number | null;
  events: DropoutEvent[];
}

export interface Dropouts {
  a: { power: DropoutSummary; cadence: DropoutSummary };
  b: { power: DropoutSummary; cadence: DropoutSummary };
  pedallingSeconds: number;
}

export interface PeakComparison {
  durationSeconds: number;
  aWatts: number | null;
  bWatts: number | null;
  percent: number | null;
}

export interface Sprint {
  startSeconds: number;
  durationSeconds: number;
  aPeakWatts: number;
  bPeakWatts: number;
  percent: number | null;
  /** Seconds from the start of the effort until the device first reads 80 % of its own peak. */
  aSecondsTo80Percent: number | null;
  bSecondsTo80Percent: number | null;
}

export interface Peaks {
  best: PeakComparison[];
  averageWatts: { a: number | null; b: number | null };
  normalisedWatts: { a: number | null; b: number | null };
  sprints: Sprint[];
}

export interface BandBias {
  label: string;
  /** Inclusive lower bound and exclusive upper bound; null upper bound means open-ended. */
  from: number;
  to: number | null;
  matchedSeconds: number;
  percent: number | null;
  meanDifferenceWatts: number | null;
}

export interface SteadySegment {
  startSeconds: number;
  durationSeconds: number;
  aWatts: number;
  bWatts: number;
  percent: number;
}

export type LikeForLikeMode = 'direct' | 'via_balance' | 'mixed';

export interface LikeForLike {
  mode: LikeForLikeMode;
  percent: number | null;
  /** Total power against total power, whatever the positions. */
  naivePercent: number | null;
  /** Which leg was compared when mode is via_balance. */
  leg: 'left' | 'right' | null;
  /** Expected reading of A relative to B from drivetrain loss alone, when exactly one measures after the chain. */
  expectedDrivetrainPercent: number | null;
}

export interface Smoothing {
  /** Mean absolute second-to-second change over consecutive matched seconds, relative to the mean power. */
  aVariation: number | null;
  bVariation: number | null;
  /** aVariation / bVariation: well below 1 means A looks smoother than B. */
  ratio: number | null;
  /** Method 2: the trailing power average each recording appears to carry, in s (1 = none), found while aligning. */
  windowSeconds?: { a: number; b: number };
}

export interface DifferenceSeries {
  intervalSeconds: number;
  /** Mean power of each device and mean A − B per interval over matched seconds; null where none matched. */
  aWatts: (number | null)[];
  bWatts: (number | null)[];
  differenceWatts: (number | null)[];
}

/** The line through the ride's five-minute differences (shared/analysis/drift.ts). */
export interface DriftEstimate {
  /** Slope of A's difference from B, in percentage points per hour of the ride, with its interval. */
  percentPerHour: number;
  lower: number;
  upper: number;
  /** The same slope in watts per hour (of the mean difference A − B per second). */
  wattsPerHour: number;
  blocks: number;
  /** Hours between the first and the last block's middle. */
  spanHours: number;
}

export interface RideTemperature {
  minCelsius: number;
  maxCelsius: number;
  meanCelsius: number;
  /** The ride's bias within each temperature band it passed through. */
  bands: { band: string; seconds: number; percent: number | null }[];
}

/** A change of the power meter's reported battery state during the ride. */
export interface BatteryReading {
  /** Seconds from the alignment start (negative: before the shared part began). */
  atSeconds: number;
  /** FIT battery_status: 1 new … 5 critical (FIT SDK profile). */
  status: number | null;
  volts: number | null;
}

export interface ComparisonResult {
  methodVersion: number;
  positions: { a: MeasurementPosition; b: MeasurementPosition };
  devices: { a: DeviceInfo; b: DeviceInfo };
  recordings: { a: RecordingStatistics; b: RecordingStatistics };
  alignment: Alignment;
  bias: Bias;
  /** ΣA and ΣB in joules over matched seconds (like for like), kept for consensus fits on log(ΣA/ΣB). */
  sums: { a: number; b: number };
  pedallingSeconds: number;
  agreement: Agreement;
  dropouts: Dropouts;
  cadenceLagSeconds: number | null;
  cadenceLagCorrelation: number | null;
  /** Method 2: the best cadence lag lies beyond the search window. */
  cadenceLagOutsideWindow?: boolean;
  peaks: Peaks;
  powerBands: BandBias[];
  cadenceBands: BandBias[];
  steadySegments: SteadySegment[];
  likeForLike: LikeForLike;
  smoothing: Smoothing;
  flags: QualityFlag[];
  series: DifferenceSeries;
  /** How the difference moved over the ride; null on rides shorter than four five-minute blocks. */
  drift?: DriftEstimate | null;
  /** Null when neither head unit records temperature. */
  temperature?: RideTemperature | null;
  /** The power meters' battery reports, where the files carry them. */
  battery?: { a: BatteryReading[]; b: BatteryReading[] };
}
