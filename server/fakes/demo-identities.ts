import type { Knex } from 'knex';
import type { Role } from '../../shared/roles';
import { ensureUser, type SessionUser } from '../features/users/users.service';
import { ensureFakeIdentity } from './fake-oauth-identities';

/**
 * A demo person who can sign in through the local fake provider: the provider's
 * identity and the linked Crosswatt account with its roles (and maker, for staff).
 * Idempotent. The demo seed calls it for `demo-staff-<maker-slug>` people.
 */
export async function ensureDemoIdentity(
  db: Knex,
  person: { handle: string; name: string; email?: string; roles?: Role[]; makerSlug?: string },
): Promise<SessionUser> {
  const email = person.email ?? `${person.handle}@demo.crosswatt.test`;
  const identity = await ensureFakeIdentity(db, { login: person.handle, name: person.name, email });
  return ensureUser(db, { ...person, email, providerId: String(identity.id) });
}

/** The fixed demo people (fictional) that the fake provider's page offers. */
export async function ensureDemoPeople(db: Knex): Promise<void> {
  await ensureDemoIdentity(db, { handle: 'demo-admin', name: 'Demo Admin', roles: ['admin'] });
  await ensureDemoIdentity(db, { handle: 'demo-moderator', name: 'Demo Moderator', roles: ['moderator'] });
  await ensureDemoIdentity(db, { handle: 'demo-rider', name: 'Demo Rider' });
}
