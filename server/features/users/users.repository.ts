import type { Knex } from 'knex';
import type { Role } from '../../../shared/roles';
import type { AdminUser, AdminUserListQuery, MakerSummary, NotificationPrefs } from '../../../shared/schemas/auth';

type Db = Knex | Knex.Transaction;

export interface UserRow {
  id: number;
  provider: string;
  providerId: string | null;
  handle: string | null;
  name: string;
  email: string | null;
  avatarUrl: string | null;
  notificationPrefs: NotificationPrefs;
  createdAt: Date;
  deletedAt: Date | null;
}

/** A row of the users table. */
interface UserRecord {
  id: number;
  provider: string;
  provider_id: string | null;
  handle: string | null;
  name: string;
  email: string | null;
  avatar_url: string | null;
  email_on_decision: boolean;
  email_on_reply: boolean;
  created_at: Date;
  deleted_at: Date | null;
}

function toUser(r: UserRecord): UserRow {
  return {
    id: r.id,
    provider: r.provider,
    providerId: r.provider_id,
    handle: r.handle,
    name: r.name,
    email: r.email,
    avatarUrl: r.avatar_url,
    notificationPrefs: { emailOnDecision: r.email_on_decision, emailOnReply: r.email_on_reply },
    createdAt: r.created_at,
    deletedAt: r.deleted_at,
  };
}

export async function findUserById(db: Db, id: number): Promise<UserRow | undefined> {
  const row = await db('users').where({ id }).first();
  return row && toUser(row);
}

export async function findUserByProvider(db: Db, provider: string, providerId: string): Promise<UserRow | undefined> {
  const row = await db('users').where({ provider, provider_id: providerId }).first();
  return row && toUser(row);
}

export async function findUserByHandle(db: Db, handle: string): Promise<UserRow | undefined> {
  const row = await db('users').where({ handle }).first();
  return row && toUser(row);
}

export interface NewUser {
  provider: string;
  providerId: string | null;
  handle: string;
  name: string;
  email: string | null;
  avatarUrl: string | null;
}

export async function insertUser(db: Db, user: NewUser): Promise<number> {
  const [{ id }] = await db('users')
    .insert({
      provider: user.provider,
      provider_id: user.providerId,
      handle: user.handle,
      name: user.name,
      email: user.email,
      avatar_url: user.avatarUrl,
      last_sign_in_at: user.providerId ? db.fn.now() : null,
    })
    .returning('id');
  return id;
}

export interface UserPatch {
  handle?: string | null;
  name?: string;
  email?: string | null;
  avatarUrl?: string | null;
  providerId?: string | null;
  notificationPrefs?: Partial<NotificationPrefs>;
  signedIn?: boolean;
  deleted?: boolean;
}

export async function updateUser(db: Db, id: number, patch: UserPatch): Promise<void> {
  const row: Record<string, unknown> = { updated_at: db.fn.now() };
  if (patch.handle !== undefined) row.handle = patch.handle;
  if (patch.name !== undefined) row.name = patch.name;
  if (patch.email !== undefined) row.email = patch.email;
  if (patch.avatarUrl !== undefined) row.avatar_url = patch.avatarUrl;
  if (patch.providerId !== undefined) row.provider_id = patch.providerId;
  if (patch.notificationPrefs?.emailOnDecision !== undefined) row.email_on_decision = patch.notificationPrefs.emailOnDecision;
  if (patch.notificationPrefs?.emailOnReply !== undefined) row.email_on_reply = patch.notificationPrefs.emailOnReply;
  if (patch.signedIn) row.last_sign_in_at = db.fn.now();
  if (patch.deleted) row.deleted_at = db.fn.now();
  await db('users').where({ id }).update(row);
}

export async function rolesOf(db: Db, userId: number): Promise<Role[]> {
  const rows = await db('role_grants').where({ user_id: userId }).orderBy('role').pluck('role');
  return rows as Role[];
}

/** Adds a grant; false when the user already held the role. */
export async function insertRoleGrant(db: Db, userId: number, role: Role, grantedBy: number | null): Promise<boolean> {
  const rows = await db('role_grants')
    .insert({ user_id: userId, role, granted_by: grantedBy })
    .onConflict(['user_id', 'role'])
    .ignore()
    .returning('id');
  return rows.length > 0;
}

/** Removes a grant; false when the user did not hold the role. */
export async function deleteRoleGrant(db: Db, userId: number, role: Role): Promise<boolean> {
  return (await db('role_grants').where({ user_id: userId, role }).delete()) > 0;
}

export async function deleteAllRoleGrants(db: Db, userId: number): Promise<void> {
  await db('role_grants').where({ user_id: userId }).delete();
}

/** Locks the admin grants of active users until the transaction ends, then counts them. */
export async function countAdminsForUpdate(trx: Knex.Transaction): Promise<number> {
  const rows = await trx('role_grants as g')
    .join('users as u', 'u.id', 'g.user_id')
    .where('g.role', 'admin')
    .whereNull('u.deleted_at')
    .forUpdate()
    .select('g.id');
  return rows.length;
}

export async function makersOf(db: Db, userId: number): Promise<MakerSummary[]> {
  return db('maker_staff as s').join('makers as m', 'm.id', 's.maker_id').where('s.user_id', userId).select('m.id', 'm.slug', 'm.name');
}

export async function upsertMakerStaff(db: Db, userId: number, makerId: number, verifiedBy: number | null): Promise<void> {
  await db('maker_staff')
    .insert({ user_id: userId, maker_id: makerId, verified_by: verifiedBy, verified_at: db.fn.now() })
    .onConflict('user_id')
    .merge(['maker_id', 'verified_by', 'verified_at']);
}

export async function deleteMakerStaff(db: Db, userId: number): Promise<boolean> {
  return (await db('maker_staff').where({ user_id: userId }).delete()) > 0;
}

export async function findMakerById(db: Db, id: number): Promise<MakerSummary | undefined> {
  return db('makers').where({ id }).first('id', 'slug', 'name');
}

export async function findMakerBySlug(db: Db, slug: string): Promise<MakerSummary | undefined> {
  return db('makers').where({ slug }).first('id', 'slug', 'name');
}

export async function insertMaker(db: Db, maker: { slug: string; name: string }): Promise<MakerSummary> {
  const [row] = await db('makers').insert(maker).onConflict('slug').merge(['slug']).returning(['id', 'slug', 'name']);
  return row;
}

export async function listMakers(db: Db): Promise<MakerSummary[]> {
  return db('makers').orderBy('name').select('id', 'slug', 'name');
}

export const USERS_PAGE_SIZE = 25;

/** A user as the admin list selects it, with roles and the maker they are staff of. */
interface AdminUserRecord {
  id: number;
  handle: string | null;
  name: string;
  email: string | null;
  roles: Role[];
  maker_id: number | null;
  maker_slug: string | null;
  maker_name: string | null;
  created_at: Date;
  deleted_at: Date | null;
}

export async function searchUsers(db: Db, query: AdminUserListQuery): Promise<{ users: AdminUser[]; total: number }> {
  const filtered = db('users as u').modify((q) => {
    if (query.q) {
      const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
      q.where((w) => w.whereILike('u.handle', like).orWhereILike('u.name', like).orWhereILike('u.email', like));
    }
    if (query.role) q.whereExists((s) => s.select(1).from('role_grants as g').whereRaw('g.user_id = u.id').where('g.role', query.role));
  });
  const [{ count }] = await filtered.clone().count<{ count: string }[]>({ count: '*' });
  const rows = await filtered
    .clone()
    .leftJoin('maker_staff as s', 's.user_id', 'u.id')
    .leftJoin('makers as m', 'm.id', 's.maker_id')
    .select(
      'u.*',
      'm.id as maker_id',
      'm.slug as maker_slug',
      'm.name as maker_name',
      db.raw("coalesce((select array_agg(g.role order by g.role) from role_grants g where g.user_id = u.id), '{}') as roles"),
    )
    .orderBy([{ column: 'u.deleted_at', order: 'desc' }, { column: 'u.handle' }, { column: 'u.id' }])
    .limit(USERS_PAGE_SIZE)
    .offset((query.page - 1) * USERS_PAGE_SIZE);
  return {
    total: Number(count),
    users: rows.map((r: AdminUserRecord) => ({
      id: r.id,
      handle: r.handle ?? '',
      name: r.name,
      email: r.email,
      roles: r.roles,
      maker: r.maker_id ? { id: r.maker_id, slug: r.maker_slug, name: r.maker_name } : null,
      createdAt: new Date(r.created_at).toISOString(),
      deleted: r.deleted_at !== null,
    })),
  };
}
