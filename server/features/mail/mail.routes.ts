import { Router } from 'express';
import { z } from 'zod';
import { mailMessageParams, type MailMessageParams } from '../../../shared/schemas/mail';
import { requireRole } from '../../auth/require-user';
import type { Config } from '../../config/env';
import type { Db } from '../../db/knex';
import type { Queue } from '../../jobs/queue';
import { messagePage } from '../../lib/message-page';
import { validate } from '../../middleware/validate';
import * as mail from './mail.repository';
import { listUndeliveredMail, resendFailedMail, topicDescription, unsubscribe } from './mail.service';

const unsubscribeQuery = z.object({ token: z.string().max(200).default('') });
const outboxQuery = z.object({ page: z.coerce.number().int().min(1).max(10_000).default(1) });

export function mailRouter({ db, config, queue }: { db: Db; config: Config; queue?: Queue }) {
  const router = Router();

  // One click from an e-mail, without signing in: the signed token says who and what.
  router.get('/unsubscribe', validate(unsubscribeQuery, 'query'), async (_req, res) => {
    const result = await unsubscribe(db, config, res.locals.query.token);
    if (!result) {
      res
        .status(400)
        .type('html')
        .send(
          messagePage(
            'This link does not work',
            'The unsubscribe link is incomplete or was changed. Use the link from the e-mail as it is, or change your e-mail settings on your account page.',
          ),
        );
      return;
    }
    res
      .type('html')
      .send(
        messagePage(
          'You are unsubscribed',
          `Crosswatt will no longer e-mail you about ${topicDescription(result.topic)}. You can switch it back on from your account page.`,
        ),
      );
  });

  // What the local fake SMTP service captured: admins only.
  router.get('/outbox', requireRole('admin'), validate(outboxQuery, 'query'), async (_req, res) => {
    const { total, messages } = await mail.listOutbox(db, res.locals.query.page);
    res.json({ total, pageSize: mail.OUTBOX_PAGE_SIZE, messages });
  });

  // Mail that has not reached the mail service, with its last error: admins only.
  router.get('/undelivered', requireRole('admin'), async (_req, res) => {
    res.json({ messages: await listUndeliveredMail(db) });
  });

  router.post('/messages/:id/resend', requireRole('admin'), validate(mailMessageParams, 'params'), async (req, res) => {
    const { id } = res.locals.params as MailMessageParams;
    await resendFailedMail(db, { config, queue }, { actorId: req.user!.id, mailId: id });
    res.status(204).end();
  });

  return router;
}
