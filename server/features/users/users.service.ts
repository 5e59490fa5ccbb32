import type { Knex } from 'knex';
import { DELETED_RIDER_NAME, type GrantableRole, type Role } from '../../../shared/roles';
import {
  type AdminUserListQuery,
  type CurrentUser,
  handleSchema,
  personNameSchema,
  type UpdateAccountInput,
} from '../../../shared/schemas/auth';
import { ConflictError, NotFoundError, ValidationError } from '../../lib/errors';
import type { Logger } from '../../lib/logger';
import type { ObjectStore } from '../../lib/object-store';
import { recordAudit } from '../audit/audit.repository';
import { detachOriginalsOfRider } from '../originals/originals.service';
import * as users from './users.repository';

/** Who is making a request, as the server keeps it on `req.user`. */
export interface SessionUser {
  id: number;
  handle: string;
  name: string;
  roles: Role[];
  makerIds: number[];
}

/** What the OAuth provider tells us about a person. */
export interface ProviderProfile {
  provider: string;
  providerId: string;
  login: string | undefined;
  name: string | undefined;
  email: string | undefined;
  avatarUrl: string | undefined;
}

export async function loadSessionUser(db: Knex, id: number): Promise<SessionUser | null> {
  const user = await users.findUserById(db, id);
  if (!user || user.deletedAt || !user.handle) return null;
  const [roles, makers] = await Promise.all([users.rolesOf(db, id), users.makersOf(db, id)]);
  return { id, handle: user.handle, name: user.name, roles, makerIds: makers.map((m) => m.id) };
}

export async function getCurrentUser(db: Knex, id: number): Promise<CurrentUser | null> {
  const user = await users.findUserById(db, id);
  if (!user || user.deletedAt || !user.handle) return null;
  const [roles, makers] = await Promise.all([users.rolesOf(db, id), users.makersOf(db, id)]);
  return {
    id,
    handle: user.handle,
    name: user.name,
    email: user.email,
    avatarUrl: user.avatarUrl,
    roles,
    makerIds: makers.map((m) => m.id),
    makers,
    notificationPrefs: user.notificationPrefs,
  };
}

// A handle that is valid and not held by someone else; the provider's id makes it unique.
async function freeHandle(trx: Knex.Transaction, login: string | undefined, providerId: string, selfId?: number) {
  const parsed = handleSchema.safeParse(login ?? '');
  const wanted = parsed.success ? parsed.data : `rider-${providerId}`.slice(0, 39);
  const holder = await users.findUserByHandle(trx, wanted);
  if (!holder || holder.id === selfId) return wanted;
  return `${wanted.slice(0, 38 - providerId.length)}-${providerId}`;
}

function cleanName(name: string | undefined, fallback: string): string {
  const parsed = personNameSchema.safeParse(name ?? '');
  return parsed.success ? parsed.data : fallback;
}

/**
 * The first sign-in creates a rider from the provider's profile; later sign-ins
 * refresh the name, e-mail and picture. One transaction: no half-created users.
 */
export async function signInWithProfile(db: Knex, profile: ProviderProfile): Promise<SessionUser> {
  const id = await db.transaction(async (trx) => {
    const existing = await users.findUserByProvider(trx, profile.provider, profile.providerId);
    if (existing) {
      const handle = await freeHandle(trx, profile.login, profile.providerId, existing.id);
      await users.updateUser(trx, existing.id, {
        handle,
        name: cleanName(profile.name, handle),
        email: profile.email ?? existing.email,
        avatarUrl: profile.avatarUrl ?? null,
        signedIn: true,
      });
      return existing.id;
    }
    const handle = await freeHandle(trx, profile.login, profile.providerId);
    const newId = await users.insertUser(trx, {
      provider: profile.provider,
      providerId: profile.providerId,
      handle,
      name: cleanName(profile.name, handle),
      email: profile.email ?? null,
      avatarUrl: profile.avatarUrl ?? null,
    });
    await users.insertRoleGrant(trx, newId, 'rider', null);
    await recordAudit(trx, {
      actorId: newId,
      action: 'user.created',
      subjectType: 'user',
      subjectId: newId,
      after: { handle, roles: ['rider'] },
    });
    return newId;
  });
  const user = await loadSessionUser(db, id);
  if (!user) throw new Error(`user ${id} vanished during sign-in`);
  return user;
}

export async function updateAccount(db: Knex, userId: number, input: UpdateAccountInput): Promise<CurrentUser> {
  await users.updateUser(db, userId, { name: input.name, notificationPrefs: input.notificationPrefs });
  const user = await getCurrentUser(db, userId);
  if (!user) throw new NotFoundError('This account no longer exists.');
  return user;
}

/**
 * Deleting an account keeps its rows (submissions' statistics stay) but removes
 * everything that identifies the person; their posts then show "deleted rider".
 * Their uploaded files are removed from the object store once the rows no longer
 * name them (a store that fails then leaves them to the sweep of unnamed objects).
 */
export async function deleteAccount(
  deps: { db: Knex; store: ObjectStore; logger?: Logger },
  userId: number,
  confirmHandle: string,
): Promise<void> {
  const { db } = deps;
  const removeOriginals = await db.transaction(async (trx) => {
    const user = await users.findUserById(trx, userId);
    if (!user || user.deletedAt) throw new NotFoundError('This account no longer exists.');
    if (user.handle !== confirmHandle) {
      throw new ValidationError('confirmHandle: type your handle exactly to confirm', {
        fields: { confirmHandle: 'does not match your handle' },
      });
    }
    const roles = await users.rolesOf(trx, userId);
    if (roles.includes('admin') && (await users.countAdminsForUpdate(trx)) <= 1) {
      throw new ConflictError('You are the last admin: make someone else an admin before deleting your account.');
    }
    await users.deleteAllRoleGrants(trx, userId);
    await users.deleteMakerStaff(trx, userId);
    await users.updateUser(trx, userId, {
      handle: null,
      name: DELETED_RIDER_NAME,
      email: null,
      avatarUrl: null,
      providerId: null,
      notificationPrefs: { emailOnDecision: false, emailOnReply: false },
      deleted: true,
    });
    // No personal data in the record: the point of deleting is to forget it.
    await recordAudit(trx, { actorId: userId, action: 'user.deleted', subjectType: 'user', subjectId: userId, before: { roles } });
    return detachOriginalsOfRider(trx, userId);
  });
  await removeOriginals(deps);
}

async function activeUser(trx: Knex.Transaction, userId: number) {
  const user = await users.findUserById(trx, userId);
  if (!user || user.deletedAt) throw new NotFoundError(`There is no user with id ${userId}.`);
  return user;
}

interface RoleChange {
  actorId: number;
  userId: number;
  role: GrantableRole;
  reason?: string;
}

// Grants and revocations share one shape: read, change, audit with the
// roles before and after, all in one transaction; no audit entry when nothing changed.
async function changeRole(db: Knex, change: RoleChange, kind: 'granted' | 'revoked'): Promise<Role[]> {
  return db.transaction(async (trx) => {
    await activeUser(trx, change.userId);
    const before = await users.rolesOf(trx, change.userId);
    if (kind === 'revoked' && change.role === 'admin' && before.includes('admin') && (await users.countAdminsForUpdate(trx)) <= 1) {
      throw new ConflictError(
        change.userId === change.actorId
          ? 'You are the last admin, so you cannot remove your own admin role. Make someone else an admin first.'
          : 'This is the last admin; Crosswatt always needs one.',
      );
    }
    const changed =
      kind === 'granted'
        ? await users.insertRoleGrant(trx, change.userId, change.role, change.actorId)
        : await users.deleteRoleGrant(trx, change.userId, change.role);
    if (!changed) return before;
    const after = await users.rolesOf(trx, change.userId);
    await recordAudit(trx, {
      actorId: change.actorId,
      action: `role.${kind}`,
      subjectType: 'user',
      subjectId: change.userId,
      reason: change.reason,
      before: { roles: before },
      after: { roles: after },
    });
    return after;
  });
}

export const grantRole = (db: Knex, change: RoleChange) => changeRole(db, change, 'granted');
export const revokeRole = (db: Knex, change: RoleChange) => changeRole(db, change, 'revoked');

export async function verifyMakerStaff(
  db: Knex,
  change: { actorId: number; userId: number; makerId: number; reason?: string },
): Promise<void> {
  await db.transaction(async (trx) => {
    await activeUser(trx, change.userId);
    const maker = await users.findMakerById(trx, change.makerId);
    if (!maker) throw new ValidationError(`makerId: there is no maker with id ${change.makerId}`, { fields: { makerId: 'unknown maker' } });
    const [before] = await users.makersOf(trx, change.userId);
    if (before?.id === maker.id) return;
    await users.upsertMakerStaff(trx, change.userId, maker.id, change.actorId);
    await recordAudit(trx, {
      actorId: change.actorId,
      action: 'maker_staff.verified',
      subjectType: 'user',
      subjectId: change.userId,
      reason: change.reason,
      before: { maker: before ?? null },
      after: { maker },
    });
  });
}

export async function removeMakerStaff(db: Knex, change: { actorId: number; userId: number; reason?: string }): Promise<void> {
  await db.transaction(async (trx) => {
    await activeUser(trx, change.userId);
    const [before] = await users.makersOf(trx, change.userId);
    if (!before) return;
    await users.deleteMakerStaff(trx, change.userId);
    await recordAudit(trx, {
      actorId: change.actorId,
      action: 'maker_staff.removed',
      subjectType: 'user',
      subjectId: change.userId,
      reason: change.reason,
      before: { maker: before },
      after: { maker: null },
    });
  });
}

export async function listUsers(db: Knex, query: AdminUserListQuery) {
  const { users: rows, total } = await users.searchUsers(db, query);
  return { users: rows, total, page: query.page, pageSize: users.USERS_PAGE_SIZE };
}

export function listMakers(db: Knex) {
  return users.listMakers(db);
}

/**
 * Makes sure a person exists with at least these roles (and, with makerSlug, as
 * verified staff of that maker, creating a minimal maker if needed). For the demo
 * seed and tests; pass providerId to link the account to a provider identity.
 */
export async function ensureUser(
  db: Knex,
  person: {
    handle: string;
    name: string;
    email?: string | null;
    roles?: Role[];
    makerSlug?: string;
    providerId?: string;
    provider?: string;
  },
): Promise<SessionUser> {
  const handle = handleSchema.parse(person.handle);
  const id = await db.transaction(async (trx) => {
    const existing =
      (person.providerId && (await users.findUserByProvider(trx, person.provider ?? 'github', person.providerId))) ||
      (await users.findUserByHandle(trx, handle));
    const userId =
      existing?.id ??
      (await users.insertUser(trx, {
        provider: person.provider ?? 'github',
        providerId: person.providerId ?? null,
        handle,
        name: person.name,
        email: person.email ?? null,
        avatarUrl: null,
      }));
    if (existing && person.providerId && !existing.providerId) await users.updateUser(trx, userId, { providerId: person.providerId });
    for (const role of new Set<Role>(['rider', ...(person.roles ?? [])])) await users.insertRoleGrant(trx, userId, role, null);
    if (person.makerSlug) {
      const maker =
        (await users.findMakerBySlug(trx, person.makerSlug)) ??
        (await users.insertMaker(trx, { slug: person.makerSlug, name: person.makerSlug }));
      await users.upsertMakerStaff(trx, userId, maker.id, null);
    }
    return userId;
  });
  const user = await loadSessionUser(db, id);
  if (!user) throw new Error(`ensureUser: ${handle} is a deleted account`);
  return user;
}
