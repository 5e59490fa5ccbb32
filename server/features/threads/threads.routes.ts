import { Router } from 'express';
import { z } from 'zod';
import {
  createPostInput,
  createThreadInput,
  editPostInput,
  lockThreadInput,
  markNotificationsReadInput,
  moveThreadInput,
  officialResponseInput,
  postVisibilityInput,
  setThreadStatusInput,
  threadListQuery,
} from '../../../shared/schemas/threads';
import { requireMakerStaff, requireNotMakerStaff, requireRole, requireUser } from '../../auth/require-user';
import { postingLimiter } from '../../middleware/rate-limit';
import { validate } from '../../middleware/validate';
import * as service from './threads.service';

const idParams = z.object({ id: z.coerce.number().int().positive('not a valid number').max(2_147_483_647, 'not a valid number') });
const slugParams = z.object({ slug: z.string().trim().min(1).max(120) });

// Threads about models, their posts, follows and notifications. Mounted at /api.
export function threadsRouter(deps: service.ThreadDeps) {
  const { db } = deps;
  const router = Router();
  const posting = postingLimiter(deps.config, db);
  const threadMakerStaff = requireMakerStaff((req) => service.makerOfThread(db, Number(req.params.id)));
  const threadId = validate(idParams, 'params');
  const show = async (id: number, user: Express.User | undefined) => service.getThread(db, id, user);

  // ——— a model's threads ———
  router.get('/models/:slug/threads', validate(slugParams, 'params'), validate(threadListQuery, 'query'), async (_req, res) => {
    res.json(await service.listModelThreads(db, res.locals.params.slug, res.locals.query));
  });
  router.post(
    '/models/:slug/threads',
    posting,
    requireUser,
    validate(slugParams, 'params'),
    validate(createThreadInput),
    async (req, res) => {
      const { id } = await service.createThread(deps, req.user!, res.locals.params.slug, res.locals.body);
      res.status(201).json({ id, url: `/threads/${id}` });
    },
  );
  router.get('/models/:slug/thread-summary', validate(slugParams, 'params'), async (_req, res) => {
    res.json(await service.getModelThreadSummary(db, res.locals.params.slug));
  });
  router.get('/models/:slug/linkable-submissions', requireUser, validate(slugParams, 'params'), async (req, res) => {
    res.json({ submissions: await service.listLinkableSubmissions(db, req.user!, res.locals.params.slug) });
  });

  // ——— one thread ———
  router.get('/threads/:id', threadId, async (req, res) => {
    res.json(await show(res.locals.params.id, req.user));
  });
  router.post('/threads/:id/posts', posting, requireUser, threadId, validate(createPostInput), async (req, res) => {
    const { id } = await service.replyToThread(deps, req.user!, res.locals.params.id, res.locals.body);
    res.status(201).json({ id, url: `/threads/${res.locals.params.id}#post-${id}` });
  });
  router.put('/threads/:id/official-response', threadId, threadMakerStaff, validate(officialResponseInput), async (req, res) => {
    await service.markOfficialResponse(deps, req.user!, res.locals.params.id, res.locals.body.postId);
    res.json(await show(res.locals.params.id, req.user));
  });
  router.delete('/threads/:id/official-response', threadId, threadMakerStaff, async (req, res) => {
    await service.markOfficialResponse(deps, req.user!, res.locals.params.id, null);
    res.json(await show(res.locals.params.id, req.user));
  });
  router.put('/threads/:id/status', threadId, threadMakerStaff, validate(setThreadStatusInput), async (req, res) => {
    await service.setThreadStatus(deps, req.user!, res.locals.params.id, res.locals.body);
    res.json(await show(res.locals.params.id, req.user));
  });
  router.put('/threads/:id/follow', requireUser, threadId, async (req, res) => {
    await service.setFollowing(db, req.user!, res.locals.params.id, true);
    res.json({ following: true });
  });
  router.delete('/threads/:id/follow', requireUser, threadId, async (req, res) => {
    await service.setFollowing(db, req.user!, res.locals.params.id, false);
    res.json({ following: false });
  });
  router.put('/threads/:id/lock', requireRole('moderator'), requireNotMakerStaff, threadId, validate(lockThreadInput), async (req, res) => {
    await service.setThreadLocked(db, req.user!, res.locals.params.id, res.locals.body.locked, res.locals.body.reason);
    res.json(await show(res.locals.params.id, req.user));
  });
  router.post(
    '/threads/:id/move',
    requireRole('moderator'),
    requireNotMakerStaff,
    threadId,
    validate(moveThreadInput),
    async (req, res) => {
      await service.moveThread(db, req.user!, res.locals.params.id, res.locals.body.modelSlug, res.locals.body.reason);
      res.json(await show(res.locals.params.id, req.user));
    },
  );

  // ——— posts ———
  router.patch('/posts/:id', posting, requireUser, validate(idParams, 'params'), validate(editPostInput), async (req, res) => {
    await service.editPost(deps, req.user!, res.locals.params.id, res.locals.body);
    res.json({ id: res.locals.params.id });
  });
  router.put(
    '/posts/:id/visibility',
    requireRole('moderator'),
    requireNotMakerStaff,
    validate(idParams, 'params'),
    validate(postVisibilityInput),
    async (req, res) => {
      await service.setPostVisibility(db, req.user!, res.locals.params.id, res.locals.body);
      res.json({ id: res.locals.params.id, hidden: res.locals.body.hidden });
    },
  );

  // ——— notifications ———
  router.get('/notifications', requireUser, async (req, res) => {
    res.json(await service.getNotifications(db, req.user!));
  });
  router.post('/notifications/read', requireUser, validate(markNotificationsReadInput), async (req, res) => {
    const body = res.locals.body as z.infer<typeof markNotificationsReadInput>;
    res.json(await service.markNotificationsRead(db, req.user!, 'all' in body ? 'all' : body.ids));
  });

  return router;
}
