import { Router } from 'express';
import { proposeCatalogueEntryInput } from '@shared/schemas/catalogue';
import { requireUser } from '../../auth/require-user';
import type { Db } from '../../db/knex';
import { validate } from '../../middleware/validate';
import { listCatalogue } from './catalogue.repository';
import { proposeEntry } from './catalogue.service';

export function catalogueRouter({ db }: { db: Db }) {
  const router = Router();
  router.get('/', async (req, res) => {
    res.json(await listCatalogue(db, req.user?.id));
  });
  router.post('/proposals', requireUser, validate(proposeCatalogueEntryInput), async (req, res) => {
    res.status(201).json(await proposeEntry(db, req.user!.id, res.locals.body));
  });
  return router;
}
