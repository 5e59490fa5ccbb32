import { Router } from 'express';
import { deleteAccountInput, type DeleteAccountInput, updateAccountInput, type UpdateAccountInput } from '../../../shared/schemas/auth';
import { requireUser } from '../../auth/require-user';
import { SESSION_COOKIE } from '../../auth/session';
import type { Db } from '../../db/knex';
import type { Logger } from '../../lib/logger';
import type { ObjectStore } from '../../lib/object-store';
import { validate } from '../../middleware/validate';
import { deleteAccount, updateAccount } from './users.service';

// The signed-in rider's own account: profile, notification preferences, deletion.
// (GET /api/me returns the account; it lives with the sign-in routes.)
export function accountRouter({ db, store, logger }: { db: Db; store: ObjectStore; logger: Logger }) {
  const router = Router();

  router.patch('/', requireUser, validate(updateAccountInput), async (req, res) => {
    res.json(await updateAccount(db, req.user!.id, res.locals.body as UpdateAccountInput));
  });

  // POST rather than DELETE so the confirmation travels in a body.
  router.post('/deletion', requireUser, validate(deleteAccountInput), async (req, res, next) => {
    await deleteAccount({ db, store, logger }, req.user!.id, (res.locals.body as DeleteAccountInput).confirmHandle);
    req.session.destroy((err) => {
      if (err) return next(err);
      res.clearCookie(SESSION_COOKIE, { path: '/' });
      res.status(204).end();
    });
  });
  return router;
}
