import { Router } from 'express';
import {
  adminUserListQuery,
  type AdminUserListQuery,
  auditLogQuery,
  type AuditLogQuery,
  grantRoleInput,
  type GrantRoleInput,
  roleParams,
  userIdParams,
  verifyMakerStaffInput,
  type VerifyMakerStaffInput,
} from '../../../shared/schemas/auth';
import type { GrantableRole } from '../../../shared/roles';
import { requireRole } from '../../auth/require-user';
import type { Db } from '../../db/knex';
import type { ObjectStore } from '../../lib/object-store';
import { validate } from '../../middleware/validate';
import { AUDIT_PAGE_SIZE, listAuditLog } from '../audit/audit.repository';
import { originalsStoreSize } from '../originals/originals.service';
import { grantRole, listMakers, listUsers, removeMakerStaff, revokeRole, verifyMakerStaff } from '../users/users.service';

// Admins manage people: roles, maker staff memberships, and read the audit log and
// how much the object store of uploaded files holds.
export function adminRouter({ db, store }: { db: Db; store: ObjectStore }) {
  const router = Router();
  const admin = requireRole('admin');
  const userId = (params: unknown) => (params as { userId: number }).userId;

  router.get('/users', admin, validate(adminUserListQuery, 'query'), async (_req, res) => {
    res.json(await listUsers(db, res.locals.query as AdminUserListQuery));
  });

  router.get('/makers', admin, async (_req, res) => {
    res.json({ makers: await listMakers(db) });
  });

  router.post('/users/:userId/roles', admin, validate(userIdParams, 'params'), validate(grantRoleInput), async (req, res) => {
    const { role, reason } = res.locals.body as GrantRoleInput;
    const roles = await grantRole(db, { actorId: req.user!.id, userId: userId(res.locals.params), role, reason });
    res.json({ roles });
  });

  router.delete('/users/:userId/roles/:role', admin, validate(roleParams, 'params'), async (req, res) => {
    const { role } = res.locals.params as { role: GrantableRole };
    const roles = await revokeRole(db, { actorId: req.user!.id, userId: userId(res.locals.params), role });
    res.json({ roles });
  });

  router.put('/users/:userId/maker-staff', admin, validate(userIdParams, 'params'), validate(verifyMakerStaffInput), async (req, res) => {
    const { makerId, reason } = res.locals.body as VerifyMakerStaffInput;
    await verifyMakerStaff(db, { actorId: req.user!.id, userId: userId(res.locals.params), makerId, reason });
    res.status(204).end();
  });

  router.delete('/users/:userId/maker-staff', admin, validate(userIdParams, 'params'), async (req, res) => {
    await removeMakerStaff(db, { actorId: req.user!.id, userId: userId(res.locals.params) });
    res.status(204).end();
  });

  router.get('/object-store', admin, async (_req, res) => {
    const { objects, bytes } = await originalsStoreSize(store);
    res.json({ objects, bytes });
  });

  router.get('/audit-log', admin, validate(auditLogQuery, 'query'), async (_req, res) => {
    const query = res.locals.query as AuditLogQuery;
    const { entries, total } = await listAuditLog(db, query);
    res.json({ entries, total, page: query.page, pageSize: AUDIT_PAGE_SIZE });
  });
  return router;
}
