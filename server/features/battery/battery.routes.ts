import { Router } from 'express';
import { z } from 'zod';
import { addRidingInput, batteryClaimInput, createBatteryEventInput, createRiderMeterInput } from '@shared/schemas/battery';
import { idNumber } from '@shared/schemas/fields';
import { modelParams } from '@shared/schemas/statistics';
import { requireNotMakerStaff, requireRole, requireUser } from '../../auth/require-user';
import type { Db } from '../../db/knex';
import { validate } from '../../middleware/validate';
import * as service from './battery.service';

const meterParams = z.object({ meterId: idNumber('not a meter number') });
const eventParams = meterParams.extend({ eventId: idNumber('not an event number') });
const ridingParams = meterParams.extend({ ridingId: idNumber('not a riding entry number') });
const claimParams = z.object({ id: idNumber('not a model number') });

/** A rider's meters and battery log, mounted at /api/me/meters. Signed-in riders only, their own meters only. */
export function myMetersRouter({ db }: { db: Db }) {
  const router = Router();
  router.use(requireUser);
  const rider = (req: Express.Request) => req.user!.id;

  router.get('/', async (req, res) => {
    res.json({ meters: await service.listMyMeters(db, rider(req)) });
  });
  router.post('/', validate(createRiderMeterInput), async (req, res) => {
    res.status(201).json({ id: await service.addMeter(db, rider(req), res.locals.body) });
  });
  router.delete('/:meterId', validate(meterParams, 'params'), async (req, res) => {
    await service.removeMeter(db, rider(req), res.locals.params.meterId);
    res.status(204).end();
  });
  router.post('/:meterId/battery-events', validate(meterParams, 'params'), validate(createBatteryEventInput), async (req, res) => {
    res.status(201).json({ id: await service.addBatteryEvent(db, rider(req), res.locals.params.meterId, res.locals.body) });
  });
  router.delete('/:meterId/battery-events/:eventId', validate(eventParams, 'params'), async (req, res) => {
    await service.removeBatteryEvent(db, rider(req), res.locals.params.meterId, res.locals.params.eventId);
    res.status(204).end();
  });
  router.post('/:meterId/riding', validate(meterParams, 'params'), validate(addRidingInput), async (req, res) => {
    res.status(201).json({ id: await service.addRiding(db, rider(req), res.locals.params.meterId, res.locals.body) });
  });
  router.delete('/:meterId/riding/:ridingId', validate(ridingParams, 'params'), async (req, res) => {
    await service.removeRiding(db, rider(req), res.locals.params.meterId, res.locals.params.ridingId);
    res.status(204).end();
  });
  return router;
}

/** Public: a model's battery life and bias by temperature band, per firmware. Mounted at /api/models. */
export function modelConditionsRouter({ db }: { db: Db }) {
  const router = Router();
  router.get('/:slug/conditions', validate(modelParams, 'params'), async (_req, res) => {
    res.json(await service.getModelConditions(db, res.locals.params.slug));
  });
  return router;
}

/** Moderators (not makers' staff: a claim is the maker's word, entered by someone else) set the maker's battery claim. Mounted at /api/moderation/models. */
export function batteryClaimRouter({ db }: { db: Db }) {
  const router = Router();
  router.put(
    '/:id/battery-claim',
    requireRole('moderator'),
    requireNotMakerStaff,
    validate(claimParams, 'params'),
    validate(batteryClaimInput),
    async (req, res) => {
      res.json(await service.setBatteryClaim(db, req.user!.id, res.locals.params.id, res.locals.body));
    },
  );
  return router;
}
