import { randomBytes } from 'node:crypto';
import type { Db } from '../../../server/db/knex';
import { insertFirmware, insertMaker, insertModel, insertRecordingDevice } from '../../../server/features/catalogue/catalogue.repository';
import type { CatalogueModel } from '../../../shared/schemas/catalogue';
import { versionOrder } from '../../../shared/schemas/catalogue';

/** A small approved catalogue of fictional meters, unique per call. */
export async function createCatalogue(db: Db) {
  const tag = randomBytes(3).toString('hex');
  const maker = await insertMaker(db, { slug: `testmaker-${tag}`, name: `Testmaker ${tag}`, status: 'approved' });
  const model = async (name: string, position: CatalogueModel['position'], kind: CatalogueModel['kind']) =>
    insertModel(db, { makerId: maker.id, slug: `testmaker-${tag}-${name.toLowerCase()}`, name, position, kind, status: 'approved' });
  const spider = await model('Orbit', 'total', 'spider');
  const pedals = await model('Treadle', 'dual', 'pedal');
  const firmware = async (modelId: number, version: string) =>
    insertFirmware(db, { modelId, version, versionOrder: versionOrder(version), releasedOn: '2026-03-01', status: 'approved' });
  const spiderFirmware = await firmware(spider.id, '2.1.0');
  const pedalsFirmware = await firmware(pedals.id, '4.0.2');
  const headUnit = await insertRecordingDevice(db, {
    slug: `pathfinder-${tag}`,
    name: `Pathfinder ${tag}`,
    kind: 'head_unit',
    status: 'approved',
  });
  return { maker, spider, pedals, spiderFirmware, pedalsFirmware, headUnit };
}

export type TestCatalogue = Awaited<ReturnType<typeof createCatalogue>>;

/** Valid form fields for a spider (A) against dual pedals (B). */
export function submissionMeta(catalogue: TestCatalogue, overrides: Record<string, unknown> = {}) {
  const tags = (modelId: number, firmwareId: number, position: string) => ({
    modelId,
    firmwareId,
    position,
    recordingDeviceId: catalogue.headUnit.id,
    recordingDeviceFirmware: '12.1',
    recordingMode: 'every_second',
    zeroOffset: 'yes',
    otherMetersOn: false,
  });
  return {
    a: tags(catalogue.spider.id, catalogue.spiderFirmware.id, 'total'),
    b: tags(catalogue.pedals.id, catalogue.pedalsFirmware.id, 'dual'),
    indoor: false,
    surface: 'smooth_road',
    notes: 'Test ride',
    ...overrides,
  };
}
