import { gunzipSync, gzipSync } from 'node:zlib';
import type { Knex } from 'knex';

// No role needs a device's serial number, and nobody needs the recordings' clock
// times outside the stream itself and the submission's ride_started_at/ended_at
// (which moderators' overlap check reads). Older rows kept both in the stored
// result (devices, recordings, alignment start and end), in device_info and
// recording_stats, and serial numbers in each stream's header: this removes them.

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    update submissions
       set result = (result - 'devices' - 'recordings') #- '{alignment,startTime}' #- '{alignment,endTime}'
     where result is not null`);
  await knex.raw(`
    update submission_recordings
       set device_info = jsonb_set(device_info, '{creator,serialNumber}', 'null'::jsonb)
     where jsonb_typeof(device_info->'creator') = 'object'`);
  await knex.raw(`
    update submission_recordings
       set device_info = jsonb_set(device_info, '{powerMeter,serialNumber}', 'null'::jsonb)
     where jsonb_typeof(device_info->'powerMeter') = 'object'`);
  await knex.raw(`
    update submission_recordings
       set recording_stats = (recording_stats - 'startTime' - 'endTime')
           || jsonb_build_object('durationSeconds', (recording_stats->>'endTime')::float8 - (recording_stats->>'startTime')::float8)
     where recording_stats->'startTime' is not null`);
  await stripStreamHeaders(knex);
}

// The removed values cannot be brought back: down leaves the rows as they are,
// which the code before this migration reads just as well (the fields it
// showed become absent or null).
export async function down(): Promise<void> {}

/** Stream layout (server/features/submissions/stream-codec.ts, v1): u32 header length, JSON header, arrays. */
async function stripStreamHeaders(knex: Knex) {
  let lastId = 0;
  for (;;) {
    const rows: Array<{ id: number; stream: Buffer }> = await knex('submission_recordings')
      .where('id', '>', lastId)
      .orderBy('id')
      .limit(200)
      .select('id', 'stream');
    if (rows.length === 0) return;
    for (const row of rows) {
      const body = gunzipSync(row.stream);
      const headerLength = body.readUInt32LE(0);
      const header = JSON.parse(body.subarray(4, 4 + headerLength).toString('utf8'));
      for (const device of [header.device?.creator, header.device?.powerMeter]) if (device) device.serialNumber = null;
      const newHeader = Buffer.from(JSON.stringify(header));
      const length = Buffer.alloc(4);
      length.writeUInt32LE(newHeader.length, 0);
      const stream = gzipSync(Buffer.concat([length, newHeader, body.subarray(4 + headerLength)]), { level: 6 });
      await knex('submission_recordings').where({ id: row.id }).update({ stream });
    }
    lastId = rows[rows.length - 1]!.id;
  }
}
