import type { Knex } from 'knex';
import { type ProposeCatalogueEntryInput, type ProposedEntry, slugify, versionOrder } from '@shared/schemas/catalogue';
import { ConflictError, NotFoundError } from '../../lib/errors';
import { isUniqueViolation } from '../../lib/pg-errors';
import * as catalogue from './catalogue.repository';

/**
 * A rider proposes a maker, model, firmware version or recording device that is
 * missing: it is usable in their own submissions at once and stays 'pending'
 * until a moderator approves it.
 */
export async function proposeEntry(db: Knex, riderId: number, input: ProposeCatalogueEntryInput): Promise<ProposedEntry> {
  try {
    switch (input.type) {
      case 'maker':
        return {
          type: input.type,
          entry: await catalogue.insertMaker(db, { slug: slugify(input.name), name: input.name, status: 'pending', proposedBy: riderId }),
        };
      case 'model': {
        const maker = await db('makers').where({ id: input.makerId }).first('slug');
        if (!maker || !(await catalogue.makerExists(db, input.makerId, riderId)))
          throw new NotFoundError('That maker is not in the catalogue.');
        const entry = await catalogue.insertModel(db, {
          makerId: input.makerId,
          slug: slugify(`${maker.slug} ${input.name}`),
          name: input.name,
          position: input.position,
          kind: input.kind,
          status: 'pending',
          proposedBy: riderId,
        });
        return { type: input.type, entry };
      }
      case 'firmware': {
        if (!(await catalogue.modelExists(db, input.modelId, riderId))) throw new NotFoundError('That model is not in the catalogue.');
        const entry = await catalogue.insertFirmware(db, {
          modelId: input.modelId,
          version: input.version,
          versionOrder: versionOrder(input.version),
          status: 'pending',
          proposedBy: riderId,
        });
        return { type: input.type, entry };
      }
      case 'recording_device':
        return {
          type: input.type,
          entry: await catalogue.insertRecordingDevice(db, {
            slug: slugify(input.name),
            name: input.name,
            kind: input.kind,
            status: 'pending',
            proposedBy: riderId,
          }),
        };
    }
  } catch (err) {
    if (isUniqueViolation(err)) throw new ConflictError('That entry is already in the catalogue (perhaps waiting for approval).');
    throw err;
  }
}
