import { z } from 'zod';
import { idNumber, singleLineText } from './fields';
import { MEASUREMENT_POSITIONS } from '../analysis/types';

export const MODEL_KINDS = ['crank_arm', 'pedal', 'spider', 'spindle', 'hub', 'trainer'] as const;
export type ModelKind = (typeof MODEL_KINDS)[number];
export const RECORDING_DEVICE_KINDS = ['head_unit', 'watch', 'app'] as const;
export type CatalogueStatus = 'approved' | 'pending' | 'rejected';

export const MODEL_KIND_LABELS: Record<ModelKind, string> = {
  crank_arm: 'Crank arm',
  pedal: 'Pedal',
  spider: 'Spider',
  spindle: 'Spindle',
  hub: 'Hub',
  trainer: 'Trainer',
};

/** Hubs and trainers measure after the chain, so they read lower by the drivetrain loss. */
export const AFTER_DRIVETRAIN_KINDS: readonly ModelKind[] = ['hub', 'trainer'];

const name = singleLineText().trim().min(2, 'at least 2 characters').max(80, 'at most 80 characters');
export const versionString = z
  .string()
  .trim()
  .regex(/^\d+(\.\d+){0,3}([-+][0-9A-Za-z.]+)?$/, 'a version like 3.2 or 3.2.1');

export const proposeCatalogueEntryInput = z.discriminatedUnion('type', [
  z.object({ type: z.literal('maker'), name }),
  z.object({
    type: z.literal('model'),
    makerId: idNumber('choose a maker'),
    name,
    position: z.enum(MEASUREMENT_POSITIONS),
    kind: z.enum(MODEL_KINDS),
  }),
  z.object({ type: z.literal('firmware'), modelId: idNumber('choose a model'), version: versionString }),
  z.object({ type: z.literal('recording_device'), name, kind: z.enum(RECORDING_DEVICE_KINDS) }),
]);
export type ProposeCatalogueEntryInput = z.infer<typeof proposeCatalogueEntryInput>;

export interface CatalogueMaker {
  id: number;
  slug: string;
  name: string;
  status: CatalogueStatus;
}
export interface CatalogueModel {
  id: number;
  makerId: number;
  slug: string;
  name: string;
  position: (typeof MEASUREMENT_POSITIONS)[number];
  kind: ModelKind;
  status: CatalogueStatus;
}
export interface CatalogueFirmware {
  id: number;
  modelId: number;
  version: string;
  releasedOn: string | null;
  beta: boolean;
  status: CatalogueStatus;
}
export interface CatalogueRecordingDevice {
  id: number;
  slug: string;
  name: string;
  kind: (typeof RECORDING_DEVICE_KINDS)[number];
  status: CatalogueStatus;
}
export interface Catalogue {
  makers: CatalogueMaker[];
  models: CatalogueModel[];
  firmware: CatalogueFirmware[];
  recordingDevices: CatalogueRecordingDevice[];
}

/** Numeric parts of a version string, for ordering versions as versions. */
export function versionOrder(version: string): number[] {
  return version.split(/[-+]/)[0].split('.').map(Number);
}

export function slugify(text: string): string {
  return text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '');
}

/** What a rider's proposal answers: the new entry, usable by its proposer at once. */
export type ProposedEntry =
  | { type: 'maker'; entry: CatalogueMaker }
  | { type: 'model'; entry: CatalogueModel }
  | { type: 'firmware'; entry: CatalogueFirmware }
  | { type: 'recording_device'; entry: CatalogueRecordingDevice };
