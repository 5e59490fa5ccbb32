import { Router } from 'express';
import { z } from 'zod';
import { mailMessageParams, type MailMessageParams } from '../../../shared/schemas/mail';
import { requireRole } from '../../auth/require-user';
import type { Config } from '../../config/env';
import type { Db } from '../../db/knex';
import type { Queue } from '../../jobs/queue';
import { validate } from '../../middleware/validate';
import * as mail from './mail.repository';
import { listUndeliveredMail, resendFailedMail, topicDescription, unsubscribe } from './mail.service';

const unsubscribeQuery = z.object({ token: z.string().max(200).default('') });
const outboxQuery = z.object({ page: z.coerce.number().int().min(1).max(10_000).default(1) });

function page(title: string, message: string): string {
  const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} · Crosswatt</title>
<style>body{font-family:"Work Sans",system-ui,sans-serif;background:#f8f6f1;color:#1d2428;margin:0;padding:4rem 1.25rem}
main{max-width:32rem;margin:0 auto;background:#fff;border:1px solid #ddd6c8;border-radius:.875rem;padding:2rem}
h1{font-size:1.5rem;margin:0 0 .75rem;color:#1d5557}a{color:#1d5557}</style></head>
<body><main><h1>${escapeHtml(title)}</h1><p>${escapeHtml(message)}</p><p><a href="/">Back to Crosswatt</a></p></main></body></html>`;
}

export function mailRouter({ db, config, queue }: { db: Db; config: Config; queue?: Queue }) {
  const router = Router();

  // One click from an e-mail, without signing in: the signed token says who and what.
  router.get('/unsubscribe', validate(unsubscribeQuery, 'query'), async (_req, res) => {
    const result = await unsubscribe(db, config, res.locals.query.token);
    if (!result) {
      res.status(400).type('html').send(page('This link does not work', 'The unsubscribe link is incomplete or was changed. Use the link from the e-mail as it is, or change your e-mail settings on your account page.'));
      return;
    }
    res.type('html').send(page('You are unsubscribed', `Crosswatt will no longer e-mail you about ${topicDescription(result.topic)}. You can switch it back on from your account page.`));
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
