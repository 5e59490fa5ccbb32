import { describe, expect, it } from 'vitest';
import { ensureUser } from '../../../server/features/users/users.service';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';

const { app, db } = await createTestContext({ fakes: true });

describe('admins managing roles', () => {
  it('when an admin makes a rider a moderator, then the rider is a moderator and the audit log records who did it', async () => {
    const { agent, csrf, user: admin } = await signedInAgent(app, { handle: 'admin-grants', roles: ['admin'] });
    const rider = await ensureUser(db, { handle: 'future-moderator', name: 'Future Moderator' });

    const res = await agent
      .post(`/api/admin/users/${rider.id}/roles`)
      .set('X-CSRF-Token', await csrf())
      .send({ role: 'moderator', reason: 'steady hand' });

    expect(res.status).toBe(200);
    expect(res.body.roles).toEqual(['moderator', 'rider']);
    const log = await agent.get('/api/admin/audit-log?subjectType=user');
    expect(log.body.entries[0]).toMatchObject({
      actor: { id: admin.id, handle: 'admin-grants' },
      action: 'role.granted',
      subjectType: 'user',
      subjectId: String(rider.id),
      reason: 'steady hand',
      before: { roles: ['rider'] },
      after: { roles: ['moderator', 'rider'] },
    });
  });

  it('when the moderator role is revoked, then the person is a rider again, and the revocation is in the audit log', async () => {
    const { agent, csrf } = await signedInAgent(app, { handle: 'admin-revokes', roles: ['admin'] });
    const moderator = await ensureUser(db, { handle: 'former-moderator', name: 'Former Moderator', roles: ['moderator'] });

    const res = await agent.delete(`/api/admin/users/${moderator.id}/roles/moderator`).set('X-CSRF-Token', await csrf());

    expect(res.status).toBe(200);
    expect(res.body.roles).toEqual(['rider']);
    const entry = await db('audit_log')
      .where({ action: 'role.revoked', subject_id: String(moderator.id) })
      .first();
    expect(entry.after).toEqual({ roles: ['rider'] });
  });

  it('when the only admin tries to remove their own admin role, then it is refused with 409 and they stay admin', async () => {
    const context = await createTestContext({ fakes: true });
    await context.db('role_grants').where({ role: 'admin' }).delete();
    const { agent, csrf, user } = await signedInAgent(context.app, { handle: 'lonely-admin', roles: ['admin'] });

    const res = await agent.delete(`/api/admin/users/${user.id}/roles/admin`).set('X-CSRF-Token', await csrf());

    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/last admin/);
    expect((await agent.get('/api/me')).body.roles).toContain('admin');
  });

  it('when there is another admin, then an admin can step down', async () => {
    const { agent, csrf, user } = await signedInAgent(app, { handle: 'stepping-down', roles: ['admin'] });

    const res = await agent.delete(`/api/admin/users/${user.id}/roles/admin`).set('X-CSRF-Token', await csrf());

    expect(res.status).toBe(200);
    expect((await agent.get('/api/me')).body.roles).toEqual(['rider']);
  });

  it('when the role is not one an admin can grant, then the answer is 400 with the field named', async () => {
    const { agent, csrf } = await signedInAgent(app, { handle: 'admin-typo', roles: ['admin'] });
    const rider = await ensureUser(db, { handle: 'typo-target', name: 'Typo Target' });

    const res = await agent
      .post(`/api/admin/users/${rider.id}/roles`)
      .set('X-CSRF-Token', await csrf())
      .send({ role: 'superuser' });

    expect(res.status).toBe(400);
    expect(res.body.error.details.fields).toHaveProperty('role');
  });

  it('when the user does not exist, then the answer is 404', async () => {
    const { agent, csrf } = await signedInAgent(app, { handle: 'admin-missing', roles: ['admin'] });

    const res = await agent
      .post('/api/admin/users/999999/roles')
      .set('X-CSRF-Token', await csrf())
      .send({ role: 'moderator' });

    expect(res.status).toBe(404);
  });
});

describe('admins verifying maker staff', () => {
  it('when an admin verifies someone as staff of a maker, then /api/me lists that maker, and removing it takes it away', async () => {
    const { agent, csrf } = await signedInAgent(app, { handle: 'admin-staff', roles: ['admin'] });
    const { agent: staffAgent, user: staff } = await signedInAgent(app, { handle: 'future-staff' });
    const [maker] = await db('makers').insert({ slug: 'northcape-cranks', name: 'Northcape Cranks' }).returning('id');

    const verify = await agent
      .put(`/api/admin/users/${staff.id}/maker-staff`)
      .set('X-CSRF-Token', await csrf())
      .send({ makerId: maker.id });
    const meAsStaff = await staffAgent.get('/api/me');
    const remove = await agent.delete(`/api/admin/users/${staff.id}/maker-staff`).set('X-CSRF-Token', await csrf());
    const meAfter = await staffAgent.get('/api/me');

    expect(verify.status).toBe(204);
    expect(meAsStaff.body.makerIds).toEqual([maker.id]);
    expect(meAsStaff.body.makers).toEqual([{ id: maker.id, slug: 'northcape-cranks', name: 'Northcape Cranks' }]);
    expect(remove.status).toBe(204);
    expect(meAfter.body.makerIds).toEqual([]);
    const actions = await db('audit_log')
      .where({ subject_id: String(staff.id) })
      .orderBy('id')
      .pluck('action');
    expect(actions).toEqual(['user.created', 'maker_staff.verified', 'maker_staff.removed']);
  });

  it('when the maker does not exist, then the answer is 400 and nothing changes', async () => {
    const { agent, csrf } = await signedInAgent(app, { handle: 'admin-nomaker', roles: ['admin'] });
    const rider = await ensureUser(db, { handle: 'staff-nomaker', name: 'No Maker' });

    const res = await agent
      .put(`/api/admin/users/${rider.id}/maker-staff`)
      .set('X-CSRF-Token', await csrf())
      .send({ makerId: 424242 });

    expect(res.status).toBe(400);
    expect(await db('maker_staff').where({ user_id: rider.id }).first()).toBeUndefined();
  });
});

describe('the admin users list', () => {
  it('when an admin searches, then matching people come back with their roles and maker', async () => {
    const { agent } = await signedInAgent(app, { handle: 'admin-search', roles: ['admin'] });
    await ensureUser(db, { handle: 'wagtail-sprinter', name: 'Wagtail Sprinter', roles: ['moderator'], makerSlug: 'wagtail-pedals' });

    const res = await agent.get('/api/admin/users?q=wagtail');

    expect(res.status).toBe(200);
    expect(res.body.total).toBe(1);
    expect(res.body.users[0]).toMatchObject({
      handle: 'wagtail-sprinter',
      roles: ['moderator', 'rider'],
      maker: { slug: 'wagtail-pedals' },
      deleted: false,
    });
  });

  it('when the search contains SQL wildcards, then they are matched literally', async () => {
    const { agent } = await signedInAgent(app, { handle: 'admin-wildcard', roles: ['admin'] });

    const res = await agent.get('/api/admin/users?q=%25');

    expect(res.status).toBe(200);
    expect(res.body.total).toBe(0);
  });

  it('when a moderator asks for the users list or the audit log, then it is refused with 403', async () => {
    const { agent } = await signedInAgent(app, { handle: 'curious-moderator', roles: ['moderator'] });

    const users = await agent.get('/api/admin/users');
    const log = await agent.get('/api/admin/audit-log');

    expect(users.status).toBe(403);
    expect(users.body.error).toEqual({ code: 'forbidden', message: 'Only admins can do this.' });
    expect(log.status).toBe(403);
  });
});
