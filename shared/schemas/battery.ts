import { z } from 'zod';
import { day } from './day';
import { idNumber, singleLineText } from './fields';

// A rider's meters and their batteries (the "My equipment" page), the maker's
// claim that moderators enter, and the battery-life and temperature figures
// that the model and firmware pages show.

export const BATTERY_TYPES = ['coin_cell', 'aaa', 'aa', 'rechargeable'] as const;
export type BatteryType = (typeof BATTERY_TYPES)[number];
export const BATTERY_TYPE_LABELS: Record<BatteryType, string> = {
  coin_cell: 'Coin cell',
  aaa: 'AAA cell',
  aa: 'AA cell',
  rechargeable: 'Built-in rechargeable',
};

export const BATTERY_EVENT_KINDS = ['changed', 'recharged'] as const;
export type BatteryEventKind = (typeof BATTERY_EVENT_KINDS)[number];

/** Why the battery before this one came out: a flat or warning battery ends its life; an early change only stops following it. */
export const PREVIOUS_BATTERY_ENDINGS = ['ran_flat', 'low_warning', 'replaced_early', 'first_battery'] as const;
export type PreviousBatteryEnding = (typeof PREVIOUS_BATTERY_ENDINGS)[number];
export const PREVIOUS_BATTERY_ENDING_LABELS: Record<PreviousBatteryEnding, string> = {
  ran_flat: 'it ran flat',
  low_warning: 'the meter warned it was low',
  replaced_early: 'I changed it early, still working',
  first_battery: 'first battery I am logging',
};

const POSITIONS = ['left', 'right', 'dual', 'total'] as const;
const notInTheFuture = (value: string) => value <= new Date().toISOString().slice(0, 10);

export const createRiderMeterInput = z.object({
  modelId: idNumber('choose a model'),
  position: z.enum(POSITIONS, { message: 'left, right, dual or total' }),
  nickname: singleLineText().pipe(z.string().trim().min(1, 'give it a name you will recognise').max(60, 'at most 60 characters')),
  batteryType: z.enum(BATTERY_TYPES, { message: 'choose the battery type' }),
});
export type CreateRiderMeterInput = z.infer<typeof createRiderMeterInput>;

export const createBatteryEventInput = z.object({
  occurredOn: day.refine(notInTheFuture, 'not a day in the future'),
  kind: z.enum(BATTERY_EVENT_KINDS, { message: 'changed or recharged' }),
  previousEnded: z.enum(PREVIOUS_BATTERY_ENDINGS, { message: 'say why the battery before came out' }),
  firmwareId: idNumber('choose the firmware the meter runs'),
});
export type CreateBatteryEventInput = z.infer<typeof createBatteryEventInput>;

export const MAX_SELF_REPORTED_HOURS = 1000;
export const addRidingInput = z.object({
  riddenOn: day.refine(notInTheFuture, 'not a day in the future'),
  hours: z
    .number({ message: 'hours as a number' })
    .positive('more than 0 hours')
    .max(MAX_SELF_REPORTED_HOURS, `at most ${MAX_SELF_REPORTED_HOURS} hours at once`),
});
export type AddRidingInput = z.infer<typeof addRidingInput>;

export const batteryClaimInput = z
  .object({
    hours: z.number({ message: 'hours as a number' }).positive('more than 0 hours').max(100_000, 'at most 100,000 hours').nullable(),
    source: singleLineText().pipe(z.string().trim().max(300, 'at most 300 characters')).nullable(),
  })
  .refine((claim) => (claim.hours === null) === (claim.source === null || claim.source === ''), {
    message: 'a claim needs its source (where the maker says it), and a source needs its hours',
    path: ['source'],
  });
export type BatteryClaimInput = z.infer<typeof batteryClaimInput>;

// ——— responses ———

export interface BatteryEventView {
  id: number;
  occurredOn: string;
  kind: BatteryEventKind;
  previousEnded: PreviousBatteryEnding;
  firmwareVersion: string;
}

/** One battery of one meter, as counted for battery life. */
export interface BatterySpanView {
  fromDay: string;
  /** Null while it is still running. */
  toDay: string | null;
  firmwareVersion: string;
  submittedHours: number;
  selfReportedHours: number;
  /** True when it ran flat (or warned); false when still running or changed early (censored). */
  ended: boolean;
}

export interface RiderMeterView {
  id: number;
  nickname: string;
  position: (typeof POSITIONS)[number];
  batteryType: BatteryType;
  model: { id: number; slug: string; name: string; makerName: string };
  events: BatteryEventView[];
  batteries: BatterySpanView[];
  /** False when the rider has two meters of this model and position: rides cannot be told apart, so only hand-added riding counts. */
  ridesAttributed: boolean;
  riding: { id: number; riddenOn: string; hours: number }[];
}

export interface BatteryLifeFigure {
  /** At least the minimum batteries and riders: below it the page says "not enough batteries yet" and the figures are null. */
  enough: boolean;
  batteries: number;
  riders: number;
  /** Batteries that ran flat (or warned); the rest are still running or were changed early. */
  ranFlat: number;
  /** Median hours per battery; null when fewer than half have run flat. */
  medianHours: number | null;
  /** Its 95 % interval from resampling riders; upper null when it cannot be bounded. */
  lowerHours: number | null;
  upperHours: number | null;
  /** Longest time followed, to say "more than N hours" when the median is not reached. */
  longestFollowedHours: number;
}

export type VerdictKind = 'better' | 'worse' | 'no_clear_difference' | 'not_enough';

export interface BatteryComparison {
  from: string;
  verdict: VerdictKind;
  words: string;
  pValue: number | null;
  /** Holm-adjusted over all of the model's firmware steps. */
  adjustedPValue: number | null;
}

export interface FirmwareBatteryLife {
  version: string;
  life: BatteryLifeFigure;
  againstPredecessor: BatteryComparison | null;
}

export interface TemperatureBandFigure {
  band: string;
  rides: number;
  riders: number;
  hours: number;
  /** Mean bias in the band over riders (each rider's rides averaged first), with its 95 % t interval; null below the minimum. */
  meanPercent: number | null;
  lowerPercent: number | null;
  upperPercent: number | null;
}

export interface FirmwareTemperature {
  version: string;
  bands: TemperatureBandFigure[];
}

export interface ModelConditions {
  claim: { hours: number; source: string } | null;
  batteryLife: BatteryLifeFigure;
  firmware: FirmwareBatteryLife[];
  temperature: { all: TemperatureBandFigure[]; firmware: FirmwareTemperature[] };
  minimums: { batteries: number; batteryRiders: number; temperatureRiders: number };
}
