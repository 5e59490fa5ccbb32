import type { Knex } from 'knex';

export interface FakeIdentity {
  id: number;
  login: string;
  name: string;
  email: string;
}

// The fake provider's own people, in the `fake_oauth_identities` table.
export function listFakeIdentities(db: Knex): Promise<FakeIdentity[]> {
  return db('fake_oauth_identities').orderBy('login').select('id', 'login', 'name', 'email');
}

export function findFakeIdentity(db: Knex, login: string): Promise<FakeIdentity | undefined> {
  return db('fake_oauth_identities').where({ login }).first('id', 'login', 'name', 'email');
}

export function findFakeIdentityById(db: Knex, id: number): Promise<FakeIdentity | undefined> {
  return db('fake_oauth_identities').where({ id }).first('id', 'login', 'name', 'email');
}

/** Creates the identity unless one with this login exists; returns it either way. */
export async function ensureFakeIdentity(db: Knex, identity: Omit<FakeIdentity, 'id'>): Promise<FakeIdentity> {
  await db('fake_oauth_identities').insert(identity).onConflict('login').ignore();
  return (await findFakeIdentity(db, identity.login))!;
}
