// The demo world as data: fictional makers, models with their firmware histories,
// recording devices and the community. Every name here is made up. Each firmware
// carries the truth the simulator injects, so the scoreboards have stories to tell
// and the validation tests know what the statistics should recover.
import type { MeasurementPosition } from '@shared/analysis/types';
import type { ModelKind } from '@shared/schemas/catalogue';
import type { Surface } from '@shared/schemas/submission';
import type { Role } from '@shared/roles';

/** What a firmware version really does, as the simulator injects it. */
export interface FirmwareTruth {
  version: string;
  /** Days before the seed date; the catalogue stores the date. */
  releasedDaysAgo: number;
  beta?: boolean;
  /** The meter's scale error against true crank power, in % (scale = 1 + bias / 100). */
  biasPercent: number;
  /** Events per pedalling hour on a smooth road, before the world's multipliers. */
  powerDropoutsPerHour: number;
  cadenceDropoutsPerHour: number;
}

export interface WorldModel {
  maker: string;
  name: string;
  position: MeasurementPosition;
  kind: ModelKind;
  /** Random noise of one reading: SD in W and in % of power, added in quadrature. */
  noiseWatts: number;
  noisePercent: number;
  /** Seconds the model's cadence trails the crank (kept ≤ 2 s: see the simulator's caveat). */
  cadenceLagSeconds: number;
  firmware: FirmwareTruth[];
  /** A short line for the README and for whoever reads the seed. */
  story?: string;
  /** Reads low by this many % per °C below `belowCelsius` (its temperature compensation falls short in the cold). */
  coldResponse?: { belowCelsius: number; percentPerDegree: number };
  /** The model's battery as its owners log it: type, the maker's claim, and the true median hours per firmware. */
  battery?: WorldBattery;
}

export interface WorldBattery {
  type: 'coin_cell' | 'aaa' | 'aa' | 'rechargeable';
  claimHours: number;
  claimSource: string;
  /** Median hours of riding per battery on each firmware version. */
  medianHoursByFirmware: Record<string, number>;
}

export interface WorldRecordingDevice {
  name: string;
  kind: 'head_unit' | 'watch' | 'app';
  /** The device's own trailing power average in s. */
  smoothingSeconds: number;
  /** Share of rides recorded change-only (the device's default, or a setting riders pick). */
  changeOnlyShare: number;
  /** Multiplies power dropouts of meters it records: one head unit has a weak radio. */
  powerDropoutFactor: number;
  firmware: string;
}

export interface RiderHabits {
  /** Share of rides on each outdoor surface; indoor rides are on the trainer surface. */
  surfaces: Partial<Record<Exclude<Surface, 'trainer'>, number>>;
  indoorShare: number;
  zeroOffset: 'yes' | 'no' | 'unsure';
  /** Share of rides with a third meter still switched on nearby. */
  otherMetersOnShare: number;
  ftpWatts: number;
  balanceRightPercent: number;
  /** Relative number of rides this rider uploads. */
  activity: number;
}

export interface WorldPerson {
  handle: string;
  name: string;
  roles: Role[];
  makerSlug?: string;
}

export interface WorldRider extends WorldPerson {
  habits: RiderHabits;
  /** Names of the models the rider owns: compared in pairs, mostly like for like. */
  meters: string[];
  /** Names of the recording devices the rider uses. */
  devices: string[];
}

export const MAKERS = [
  { slug: 'halvard-cycleworks', name: 'Halvard Cycleworks' },
  { slug: 'quillon-dynamics', name: 'Quillon Dynamics' },
  { slug: 'sorrel-labs', name: 'Sorrel Labs' },
  { slug: 'tamarack-instruments', name: 'Tamarack Instruments' },
  { slug: 'brindle-and-kite', name: 'Brindle & Kite' },
  { slug: 'oxeye-motion', name: 'Oxeye Motion' },
] as const;

/** Dropouts come more often on broken surfaces; the trainer room is quiet. */
export const SURFACE_DROPOUT_FACTOR: Record<Surface, number> = { smooth_road: 1, rough_road: 1.8, gravel: 2.5, trainer: 0.7 };
/** Another meter broadcasting on the bike crowds the radio: power dropouts only. */
export const OTHER_METERS_ON_POWER_FACTOR = 1.6;

const fw = (
  version: string,
  releasedDaysAgo: number,
  biasPercent: number,
  powerDropoutsPerHour: number,
  cadenceDropoutsPerHour: number,
  beta = false,
): FirmwareTruth => ({ version, releasedDaysAgo, biasPercent, powerDropoutsPerHour, cadenceDropoutsPerHour, ...(beta && { beta }) });

export const MODELS: WorldModel[] = [
  // Halvard Cycleworks: the steady old hand.
  {
    maker: 'halvard-cycleworks',
    name: 'Tillerman Spider',
    position: 'total',
    kind: 'spider',
    noiseWatts: 1.5,
    noisePercent: 0.8,
    cadenceLagSeconds: 1,
    story: 'Steady and trusted: four releases, the same small offset every time.',
    firmware: [
      fw('3.0', 900, -0.3, 0.2, 0.1),
      fw('3.1', 640, -0.3, 0.2, 0.1),
      fw('3.3', 380, -0.3, 0.15, 0.1),
      fw('3.4', 150, -0.3, 0.15, 0.1),
    ],
  },
  {
    maker: 'halvard-cycleworks',
    name: 'Gannet Left Arm',
    position: 'left',
    kind: 'crank_arm',
    noiseWatts: 2.5,
    noisePercent: 1.5,
    cadenceLagSeconds: 1,
    firmware: [fw('1.2', 820, 1.0, 0.6, 0.4), fw('1.5', 430, 1.0, 0.5, 0.3), fw('1.6', 120, 0.9, 0.5, 0.3)],
  },
  {
    maker: 'halvard-cycleworks',
    name: 'Gannet Twin Arms',
    position: 'dual',
    kind: 'crank_arm',
    noiseWatts: 2,
    noisePercent: 1.2,
    cadenceLagSeconds: 1,
    firmware: [fw('2.0', 700, 0.5, 0.4, 0.3), fw('2.2', 300, 0.5, 0.3, 0.3)],
  },
  {
    maker: 'halvard-cycleworks',
    name: 'Wheelhouse Hub',
    position: 'total',
    kind: 'hub',
    noiseWatts: 2.5,
    noisePercent: 1.4,
    cadenceLagSeconds: 2,
    firmware: [fw('4.1', 860, 0.2, 0.5, 0.6), fw('4.2', 500, 0.2, 0.4, 0.5), fw('4.4', 200, 0.2, 0.4, 0.5)],
  },
  // Quillon Dynamics: pedals whose cadence used to drop out.
  {
    maker: 'quillon-dynamics',
    name: 'Larkspur Duo',
    position: 'dual',
    kind: 'pedal',
    noiseWatts: 2,
    noisePercent: 1.2,
    cadenceLagSeconds: 0,
    story: 'Frequent cadence dropouts until firmware 1.4 fixed them.',
    firmware: [fw('1.0', 760, 0.8, 0.4, 3.5), fw('1.1', 560, 0.8, 0.4, 3.2), fw('1.4', 330, 0.8, 0.4, 0.3), fw('1.5', 90, 0.8, 0.3, 0.3)],
  },
  {
    maker: 'quillon-dynamics',
    name: 'Larkspur Single',
    position: 'left',
    kind: 'pedal',
    noiseWatts: 2.5,
    noisePercent: 1.6,
    cadenceLagSeconds: 0,
    firmware: [fw('1.0', 760, -1.2, 0.5, 2.5), fw('1.4', 330, -1.2, 0.5, 0.3)],
  },
  {
    maker: 'quillon-dynamics',
    name: 'Ferrule Spindle',
    position: 'total',
    kind: 'spindle',
    noiseWatts: 2,
    noisePercent: 1.1,
    cadenceLagSeconds: 1,
    firmware: [fw('0.9', 620, 0.8, 0.6, 0.4), fw('1.0', 410, 0.8, 0.5, 0.4), fw('1.1', 45, 0.8, 0.5, 0.4, true)],
  },
  // Sorrel Labs: the spider whose update read high.
  {
    maker: 'sorrel-labs',
    name: 'Marrow Spider',
    position: 'total',
    kind: 'spider',
    noiseWatts: 1.8,
    noisePercent: 1,
    cadenceLagSeconds: 1,
    story: 'Firmware 2.1 introduced a +2 % bias; 2.2 took it back out.',
    firmware: [fw('2.0', 800, 0.1, 0.3, 0.2), fw('2.1', 420, 2.1, 0.3, 0.2), fw('2.2', 200, 0.1, 0.3, 0.2)],
  },
  {
    maker: 'sorrel-labs',
    name: 'Marrow Crank L',
    position: 'left',
    kind: 'crank_arm',
    noiseWatts: 2.5,
    noisePercent: 1.5,
    cadenceLagSeconds: 1,
    firmware: [fw('1.0', 780, -0.5, 0.6, 0.5), fw('1.2', 380, -0.5, 0.5, 0.4)],
  },
  {
    maker: 'sorrel-labs',
    name: 'Pip Pedals',
    position: 'dual',
    kind: 'pedal',
    noiseWatts: 3,
    noisePercent: 2.2,
    cadenceLagSeconds: 0,
    story: 'Reads low in the cold: about 0.4 % less for every degree below 8 °C, despite its temperature compensation.',
    coldResponse: { belowCelsius: 8, percentPerDegree: 0.4 },
    firmware: [fw('5.0', 690, 1.5, 0.8, 0.5), fw('5.1', 340, 1.5, 0.7, 0.5), fw('5.3', 110, 1.4, 0.6, 0.4)],
  },
  // Tamarack Instruments: crank arms for either side, a hub and a spider.
  {
    maker: 'tamarack-instruments',
    name: 'Sprag Right',
    position: 'right',
    kind: 'crank_arm',
    noiseWatts: 2.5,
    noisePercent: 1.5,
    cadenceLagSeconds: 1,
    story: 'The only right-side meter: it reads low.',
    firmware: [fw('2.3', 720, -1.8, 0.5, 0.4), fw('2.5', 260, -1.8, 0.5, 0.4)],
  },
  {
    maker: 'tamarack-instruments',
    name: 'Sprag Left',
    position: 'left',
    kind: 'crank_arm',
    noiseWatts: 2.5,
    noisePercent: 1.5,
    cadenceLagSeconds: 1,
    firmware: [fw('2.3', 720, -0.8, 0.5, 0.4), fw('2.5', 260, -0.8, 0.5, 0.4), fw('2.6', 60, -0.8, 0.4, 0.4)],
  },
  {
    maker: 'tamarack-instruments',
    name: 'Capstan Hub',
    position: 'total',
    kind: 'hub',
    noiseWatts: 2.5,
    noisePercent: 1.3,
    cadenceLagSeconds: 2,
    firmware: [fw('6.0', 880, 0.5, 0.6, 0.6), fw('6.2', 450, 0.5, 0.5, 0.6)],
  },
  {
    maker: 'tamarack-instruments',
    name: 'Quadrant Spider',
    position: 'total',
    kind: 'spider',
    noiseWatts: 1.8,
    noisePercent: 0.9,
    cadenceLagSeconds: 1,
    firmware: [fw('1.0', 600, 0.2, 0.3, 0.2), fw('1.1', 240, 0.2, 0.3, 0.2)],
  },
  // Brindle & Kite: a trainer whose 5.2 lost power over and over.
  {
    maker: 'brindle-and-kite',
    name: 'Drumlin Trainer',
    position: 'total',
    kind: 'trainer',
    noiseWatts: 3,
    noisePercent: 1.5,
    cadenceLagSeconds: 1,
    story: 'Firmware 5.2 dropped power again and again; 5.3 fixed it.',
    firmware: [fw('5.0', 850, -0.6, 0.4, 0.3), fw('5.2', 470, -0.6, 5, 0.3), fw('5.3', 230, -0.6, 0.4, 0.3)],
  },
  {
    maker: 'brindle-and-kite',
    name: 'Wicket Left Arm',
    position: 'left',
    kind: 'crank_arm',
    noiseWatts: 3,
    noisePercent: 1.8,
    cadenceLagSeconds: 1,
    firmware: [fw('3.0', 740, 2.5, 0.9, 0.5), fw('3.2', 350, 2.5, 0.9, 0.5)],
  },
  {
    maker: 'brindle-and-kite',
    name: 'Pennant Pedals',
    position: 'dual',
    kind: 'pedal',
    noiseWatts: 2,
    noisePercent: 1.2,
    cadenceLagSeconds: 0,
    story: 'Firmware 1.3 wakes faster and its coin cells last less than half as long: some 180 hours instead of 400.',
    battery: {
      type: 'coin_cell',
      claimHours: 400,
      claimSource: "Brindle & Kite's pedal manual, battery section",
      medianHoursByFirmware: { '1.0': 410, '1.1': 400, '1.3': 180 },
    },
    firmware: [fw('1.0', 660, -0.4, 0.4, 0.3), fw('1.1', 390, -0.4, 0.4, 0.3), fw('1.3', 140, -0.4, 0.3, 0.3)],
  },
  // Oxeye Motion: a newcomer and a trainer.
  {
    maker: 'oxeye-motion',
    name: 'Nib Pedals',
    position: 'dual',
    kind: 'pedal',
    noiseWatts: 2.5,
    noisePercent: 1.4,
    cadenceLagSeconds: 0,
    story: 'New: only a couple of rides so far, not enough to say.',
    firmware: [fw('0.8', 70, 1.0, 0.5, 0.4), fw('0.9', 25, 1.0, 0.5, 0.4)],
  },
  {
    maker: 'oxeye-motion',
    name: 'Millrace Trainer',
    position: 'total',
    kind: 'trainer',
    noiseWatts: 3,
    noisePercent: 1.6,
    cadenceLagSeconds: 1,
    firmware: [fw('2.0', 780, -1.5, 0.5, 0.4), fw('2.1', 520, -1.5, 0.5, 0.4), fw('2.4', 180, -1.5, 0.4, 0.3)],
  },
  {
    maker: 'oxeye-motion',
    name: 'Lumen Spider',
    position: 'total',
    kind: 'spider',
    noiseWatts: 2,
    noisePercent: 1,
    cadenceLagSeconds: 1,
    firmware: [fw('1.0', 640, 0.6, 0.3, 0.3), fw('1.2', 280, 0.6, 0.3, 0.3)],
  },
];

export const RECORDING_DEVICES: WorldRecordingDevice[] = [
  { name: 'Pathwick Slate', kind: 'head_unit', smoothingSeconds: 1, changeOnlyShare: 0, powerDropoutFactor: 1, firmware: '12.4' },
  { name: 'Pathwick Slate Mini', kind: 'head_unit', smoothingSeconds: 1, changeOnlyShare: 0.5, powerDropoutFactor: 1, firmware: '8.1' },
  { name: 'Corrie Trailhead', kind: 'head_unit', smoothingSeconds: 2, changeOnlyShare: 0.1, powerDropoutFactor: 1, firmware: '3.7' },
  { name: 'Ombra Ledger', kind: 'head_unit', smoothingSeconds: 1, changeOnlyShare: 0, powerDropoutFactor: 2.2, firmware: '1.9' },
  { name: 'Lantern Bar Computer', kind: 'head_unit', smoothingSeconds: 3, changeOnlyShare: 0, powerDropoutFactor: 1, firmware: '5.0' },
  { name: 'Nimbus Wristlet', kind: 'watch', smoothingSeconds: 1, changeOnlyShare: 0.9, powerDropoutFactor: 1.2, firmware: '22.1' },
  { name: 'Tallyho Ride', kind: 'app', smoothingSeconds: 2, changeOnlyShare: 0.6, powerDropoutFactor: 1, firmware: '4.12' },
  { name: 'Quern Studio', kind: 'app', smoothingSeconds: 1, changeOnlyShare: 0, powerDropoutFactor: 1, firmware: '2.3' },
];

/** Models whose numbers stay thin on purpose: at most this many submissions each. */
export const THIN_EVIDENCE_MODELS: Record<string, number> = { 'Nib Pedals': 3 };

export const STAFF: WorldPerson[] = [
  { handle: 'demo-admin', name: 'Ines Quarrington', roles: ['admin'] },
  { handle: 'demo-moderator', name: 'Tobiah Wrenfield', roles: ['moderator'] },
  { handle: 'demo-moderator-odile', name: 'Odile Marchbank', roles: ['moderator'] },
  { handle: 'demo-moderator-kasim', name: 'Kasim Ellendorf', roles: ['moderator'] },
  { handle: 'demo-staff-halvard-cycleworks', name: 'Brannagh Holt', roles: [], makerSlug: 'halvard-cycleworks' },
  { handle: 'demo-staff-quillon-dynamics', name: 'Severin Aptow', roles: [], makerSlug: 'quillon-dynamics' },
  { handle: 'demo-staff-sorrel-labs', name: 'Yelena Pardoe', roles: [], makerSlug: 'sorrel-labs' },
  { handle: 'demo-staff-brindle-and-kite', name: 'Maxen Cordwell', roles: [], makerSlug: 'brindle-and-kite' },
];

const HABIT_PROFILES = {
  roadie: { surfaces: { smooth_road: 0.8, rough_road: 0.2 }, indoorShare: 0.1 },
  allroad: { surfaces: { smooth_road: 0.5, rough_road: 0.3, gravel: 0.2 }, indoorShare: 0.15 },
  gravel: { surfaces: { smooth_road: 0.2, rough_road: 0.2, gravel: 0.6 }, indoorShare: 0.05 },
  winter: { surfaces: { smooth_road: 0.6, rough_road: 0.4 }, indoorShare: 0.5 },
  indoor: { surfaces: { smooth_road: 1 }, indoorShare: 0.9 },
} satisfies Record<string, Pick<RiderHabits, 'surfaces' | 'indoorShare'>>;

type RiderRow = [
  handle: string,
  name: string,
  profile: keyof typeof HABIT_PROFILES,
  meters: string[],
  devices: string[],
  zeroOffset: RiderHabits['zeroOffset'],
  otherMetersOnShare: number,
  activity: number,
];

// Meters go in pairs a rider can compare like for like (same position, totals
// against dual meters, one leg against a dual meter's balance), so that the
// comparisons form one connected network for the consensus fit.
const RIDER_ROWS: RiderRow[] = [
  ['demo-rider', 'Wren Aldous', 'allroad', ['Larkspur Duo', 'Marrow Spider'], ['Pathwick Slate'], 'yes', 0.1, 1.4],
  ['saoirse-fennimore', 'Saoirse Fennimore', 'roadie', ['Larkspur Duo', 'Tillerman Spider'], ['Pathwick Slate'], 'yes', 0, 1.2],
  ['ottoline-brask', 'Ottoline Brask', 'allroad', ['Larkspur Duo', 'Gannet Left Arm'], ['Corrie Trailhead'], 'yes', 0.2, 1],
  ['jory-vantreight', 'Jory Vantreight', 'roadie', ['Larkspur Duo', 'Marrow Spider'], ['Pathwick Slate Mini'], 'unsure', 0, 1.3],
  ['maelle-oakhurst', 'Maëlle Oakhurst', 'allroad', ['Larkspur Duo', 'Capstan Hub'], ['Ombra Ledger'], 'yes', 0.1, 1],
  ['tobin-quist', 'Tobin Quist', 'indoor', ['Larkspur Duo', 'Drumlin Trainer'], ['Quern Studio'], 'yes', 0, 1.4],
  ['ilse-marrable', 'Ilse Marrable', 'gravel', ['Larkspur Single', 'Gannet Twin Arms'], ['Corrie Trailhead'], 'no', 0.3, 0.8],
  [
    'caspian-hollis-grey',
    'Caspian Hollis-Grey',
    'allroad',
    ['Larkspur Single', 'Gannet Twin Arms', 'Wheelhouse Hub'],
    ['Pathwick Slate'],
    'yes',
    0.2,
    1,
  ],
  ['nell-ashdown', 'Nell Ashdown', 'roadie', ['Gannet Twin Arms', 'Marrow Spider'], ['Lantern Bar Computer'], 'yes', 0, 0.9],
  ['ravi-tennant-cole', 'Ravi Tennant-Cole', 'roadie', ['Pip Pedals', 'Tillerman Spider'], ['Pathwick Slate'], 'yes', 0.1, 1.1],
  ['bettany-lusk', 'Bettany Lusk', 'allroad', ['Pip Pedals', 'Marrow Crank L'], ['Nimbus Wristlet'], 'unsure', 0.2, 0.9],
  ['hollis-varga-penn', 'Hollis Varga-Penn', 'roadie', ['Pip Pedals', 'Quadrant Spider'], ['Ombra Ledger'], 'yes', 0, 1],
  ['fenna-duskwood', 'Fenna Duskwood', 'indoor', ['Pip Pedals', 'Millrace Trainer'], ['Tallyho Ride'], 'no', 0, 1.2],
  ['arlo-pemberthy', 'Arlo Pemberthy', 'roadie', ['Pennant Pedals', 'Sprag Right'], ['Pathwick Slate'], 'yes', 0.1, 1],
  ['wilhelmina-oduya', 'Wilhelmina Oduya', 'allroad', ['Pennant Pedals', 'Sprag Left'], ['Corrie Trailhead'], 'yes', 0.3, 1],
  ['dax-morrow-lind', 'Dax Morrow-Lind', 'gravel', ['Pennant Pedals', 'Ferrule Spindle'], ['Pathwick Slate Mini'], 'no', 0.2, 0.9],
  ['isaura-kell', 'Isaura Kell', 'roadie', ['Pennant Pedals', 'Wheelhouse Hub'], ['Lantern Bar Computer'], 'yes', 0, 0.8],
  ['peregrine-sallow', 'Peregrine Sallow', 'indoor', ['Pennant Pedals', 'Drumlin Trainer'], ['Quern Studio'], 'yes', 0, 1.3],
  ['tamsin-orrell', 'Tamsin Orrell', 'roadie', ['Larkspur Duo', 'Sprag Right'], ['Pathwick Slate'], 'unsure', 0.1, 1],
  ['gideon-flaxman', 'Gideon Flaxman', 'gravel', ['Larkspur Duo', 'Wicket Left Arm'], ['Ombra Ledger'], 'no', 0.4, 1],
  ['ysolde-pinkerly', 'Ysolde Pinkerly', 'gravel', ['Pip Pedals', 'Wicket Left Arm'], ['Nimbus Wristlet'], 'unsure', 0.3, 1],
  ['mortimer-achebe-ross', 'Mortimer Achebe-Ross', 'roadie', ['Tillerman Spider', 'Capstan Hub'], ['Pathwick Slate'], 'yes', 0, 1],
  ['clementine-vyse', 'Clementine Vyse', 'allroad', ['Marrow Spider', 'Wheelhouse Hub'], ['Corrie Trailhead'], 'yes', 0.1, 1],
  ['anselm-trowbridge', 'Anselm Trowbridge', 'indoor', ['Quadrant Spider', 'Drumlin Trainer'], ['Quern Studio'], 'yes', 0, 1],
  ['petra-hallgarth', 'Petra Hallgarth', 'indoor', ['Lumen Spider', 'Millrace Trainer'], ['Tallyho Ride'], 'unsure', 0, 1],
  ['lucan-merriweather', 'Lucan Merriweather', 'allroad', ['Lumen Spider', 'Pennant Pedals'], ['Pathwick Slate Mini'], 'yes', 0.1, 0.9],
  ['zinnia-copplestone', 'Zinnia Copplestone', 'roadie', ['Ferrule Spindle', 'Capstan Hub'], ['Lantern Bar Computer'], 'yes', 0, 0.8],
  ['eamon-strick', 'Eamon Strick', 'allroad', ['Ferrule Spindle', 'Larkspur Duo'], ['Ombra Ledger'], 'no', 0.3, 1],
  ['rosalind-thackeray-bo', 'Rosalind Thackeray-Bo', 'roadie', ['Marrow Spider', 'Pennant Pedals'], ['Pathwick Slate'], 'yes', 0, 1.1],
  [
    'kit-abernathy-sol',
    'Kit Abernathy-Sol',
    'winter',
    ['Tillerman Spider', 'Drumlin Trainer'],
    ['Quern Studio', 'Pathwick Slate'],
    'yes',
    0,
    1,
  ],
  ['odalys-winterbourne', 'Odalys Winterbourne', 'gravel', ['Tillerman Spider', 'Pip Pedals'], ['Corrie Trailhead'], 'yes', 0.2, 1],
  ['barnaby-quell', 'Barnaby Quell', 'roadie', ['Gannet Twin Arms', 'Tillerman Spider'], ['Pathwick Slate Mini'], 'yes', 0, 0.9],
  ['ines-tollemache', 'Inès Tollemache', 'allroad', ['Marrow Crank L', 'Larkspur Duo'], ['Nimbus Wristlet'], 'unsure', 0.2, 0.9],
  ['hamish-ortolan', 'Hamish Ortolan', 'allroad', ['Sprag Left', 'Pip Pedals'], ['Ombra Ledger'], 'yes', 0.1, 1],
  ['femi-lanyard', 'Femi Lanyard', 'roadie', ['Sprag Right', 'Pip Pedals'], ['Pathwick Slate'], 'yes', 0, 0.9],
  ['marguerite-olsby', 'Marguerite Olsby', 'allroad', ['Gannet Left Arm', 'Pennant Pedals'], ['Corrie Trailhead'], 'no', 0.2, 0.9],
  ['solenne-barrow-hart', 'Solenne Barrow-Hart', 'roadie', ['Quadrant Spider', 'Larkspur Duo'], ['Lantern Bar Computer'], 'yes', 0, 1],
  ['teodor-glassby', 'Teodor Glassby', 'indoor', ['Millrace Trainer', 'Larkspur Duo'], ['Tallyho Ride'], 'yes', 0, 1.1],
  [
    'verity-coldharbour',
    'Verity Coldharbour',
    'winter',
    ['Marrow Spider', 'Drumlin Trainer'],
    ['Quern Studio', 'Corrie Trailhead'],
    'yes',
    0,
    1,
  ],
  ['oisin-partridge-lowe', 'Oisín Partridge-Lowe', 'allroad', ['Lumen Spider', 'Capstan Hub'], ['Pathwick Slate'], 'unsure', 0.1, 0.9],
  ['agathe-rimmington', 'Agathe Rimmington', 'roadie', ['Wheelhouse Hub', 'Gannet Twin Arms'], ['Ombra Ledger'], 'yes', 0.2, 0.8],
  ['linus-farrowdale', 'Linus Farrowdale', 'gravel', ['Larkspur Single', 'Gannet Twin Arms'], ['Nimbus Wristlet'], 'no', 0.3, 0.8],
  [
    'delphine-achterberg',
    'Delphine Achterberg',
    'allroad',
    ['Quadrant Spider', 'Pennant Pedals', 'Capstan Hub'],
    ['Pathwick Slate'],
    'yes',
    0.1,
    1,
  ],
  ['quentin-sparrowhawk', 'Quentin Sparrowhawk', 'roadie', ['Nib Pedals', 'Lumen Spider'], ['Pathwick Slate Mini'], 'yes', 0, 0.5],
  ['margit-elsworth', 'Margit Elsworth', 'allroad', ['Gannet Left Arm', 'Larkspur Duo'], ['Lantern Bar Computer'], 'unsure', 0.1, 1],
];

export const RIDERS: WorldRider[] = RIDER_ROWS.map(
  ([handle, name, profile, meters, devices, zeroOffset, otherMetersOnShare, activity], i) => ({
    handle,
    name,
    roles: [],
    meters,
    devices,
    habits: {
      ...HABIT_PROFILES[profile],
      zeroOffset,
      otherMetersOnShare,
      activity,
      // Spread deterministically over the community: 180–330 W, 48–53 % right.
      ftpWatts: 180 + ((i * 37) % 150),
      balanceRightPercent: 48 + ((i * 7) % 6),
    },
  }),
);
