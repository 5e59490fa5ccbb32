import { randomBytes } from 'node:crypto';
import type { Db } from '../../../server/db/knex';
import type { TestCatalogue } from './catalogue-factory';
import type { TestAgent } from './sign-in';

/**
 * An accepted submission of the catalogue's spider (A) against its pedals (B),
 * written straight to the database: thread tests only need its status, tags and
 * headline figures.
 */
export async function insertAcceptedSubmission(
  db: Db,
  catalogue: TestCatalogue,
  options: { riderId: number; biasPercent?: number; status?: string },
): Promise<number> {
  const started = new Date('2026-06-01T08:00:00Z');
  const [{ id }] = await db('submissions')
    .insert({
      rider_id: options.riderId,
      status: options.status ?? 'accepted',
      indoor: false,
      surface: 'gravel',
      a_sha256: randomBytes(32).toString('hex'),
      b_sha256: randomBytes(32).toString('hex'),
      ride_started_at: started,
      ride_ended_at: new Date(started.getTime() + 3_600_000),
      bias_percent: options.biasPercent ?? 1.8,
      loa_lower_percent: -2.1,
      loa_upper_percent: 5.7,
      a_power_dropouts: 3,
      b_power_dropouts: 0,
    })
    .returning('id');
  const side = (s: 'a' | 'b', modelId: number, firmwareId: number) => ({
    submission_id: id,
    side: s,
    model_id: modelId,
    firmware_id: firmwareId,
    position: s === 'a' ? 'total' : 'dual',
    recording_device_id: catalogue.headUnit.id,
    recording_mode: 'every_second',
    zero_offset: 'yes',
    other_meters_on: false,
    sha256: randomBytes(32).toString('hex'),
    device_info: '{}',
    recording_stats: '{}',
    stream: Buffer.alloc(0),
  });
  await db('submission_recordings').insert([
    side('a', catalogue.spider.id, catalogue.spiderFirmware.id),
    side('b', catalogue.pedals.id, catalogue.pedalsFirmware.id),
  ]);
  return id;
}

export interface Person {
  agent: TestAgent;
  csrf: () => Promise<string>;
  user: { id: number };
}

/** Starts a thread on a model as this person; returns the response. */
export async function startThread(person: Person, modelSlug: string, fields: Record<string, unknown> = {}) {
  return person.agent
    .post(`/api/models/${modelSlug}/threads`)
    .set('X-CSRF-Token', await person.csrf())
    .send({ title: 'Cadence drops out on gravel', body: 'Since the last update the cadence drops to zero on rough gravel.', ...fields });
}

/** Replies in a thread as this person; returns the response. */
export async function reply(person: Person, threadId: number, body: string, fields: Record<string, unknown> = {}) {
  return person.agent
    .post(`/api/threads/${threadId}/posts`)
    .set('X-CSRF-Token', await person.csrf())
    .send({ body, ...fields });
}

/** Any other write as this person. */
export async function write(person: Person, method: 'put' | 'post' | 'patch' | 'delete', url: string, body?: object) {
  const req = person.agent[method](url).set('X-CSRF-Token', await person.csrf());
  return body === undefined ? req : req.send(body);
}
