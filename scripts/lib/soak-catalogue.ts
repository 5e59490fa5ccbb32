import type { Db } from '../../server/db/knex';
import { insertFirmware, insertMaker, insertModel, insertRecordingDevice } from '../../server/features/catalogue/catalogue.repository';
import { versionOrder } from '../../shared/schemas/catalogue';

// The soak's own small catalogue of fictional meters: a spider (A, total) judged
// against dual pedals (B), both recorded by one head unit.
export async function createSoakCatalogue(db: Db) {
  const maker = await insertMaker(db, { slug: 'soakworks', name: 'Soakworks', status: 'approved' });
  const spider = await insertModel(db, {
    makerId: maker.id,
    slug: 'soakworks-tidal',
    name: 'Tidal',
    position: 'total',
    kind: 'spider',
    status: 'approved',
  });
  const pedals = await insertModel(db, {
    makerId: maker.id,
    slug: 'soakworks-ebb',
    name: 'Ebb',
    position: 'dual',
    kind: 'pedal',
    status: 'approved',
  });
  const firmware = (modelId: number, version: string) =>
    insertFirmware(db, { modelId, version, versionOrder: versionOrder(version), releasedOn: '2026-03-01', status: 'approved' });
  const spiderFirmware = await firmware(spider.id, '1.4.0');
  const pedalsFirmware = await firmware(pedals.id, '2.0.1');
  const headUnit = await insertRecordingDevice(db, { slug: 'soakworks-lantern', name: 'Lantern', kind: 'head_unit', status: 'approved' });
  const side = (modelId: number, firmwareId: number, position: string) => ({
    modelId,
    firmwareId,
    position,
    recordingDeviceId: headUnit.id,
    recordingDeviceFirmware: '',
    recordingMode: 'every_second',
    zeroOffset: 'yes',
    otherMetersOn: false,
  });
  return {
    spider: { slug: spider.slug, firmware: spiderFirmware.version },
    pedals: { slug: pedals.slug, firmware: pedalsFirmware.version },
    /** The upload form's fields for every soak pair. */
    meta: {
      a: side(spider.id, spiderFirmware.id, 'total'),
      b: side(pedals.id, pedalsFirmware.id, 'dual'),
      indoor: false,
      surface: 'smooth_road',
      notes: 'Soak ride',
    },
  };
}

export type SoakCatalogue = Awaited<ReturnType<typeof createSoakCatalogue>>;
