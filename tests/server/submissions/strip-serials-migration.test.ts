import { gunzipSync, gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import * as migration from '../../../migrations/20261202020000_strip_serials_and_clock_times';
import { decodeStream } from '../../../server/features/submissions/stream-codec';
import { ensureUser } from '../../../server/features/users/users.service';
import { submissionAwaitingReview } from '../moderation/moderation-fixtures';
import { createCatalogue } from '../support/catalogue-factory';
import { createTestContext } from '../support/test-app';

const { db } = await createTestContext();

const OLD_DEVICE = {
  creator: { manufacturerId: 255, productId: 7, serialNumber: 300_417, softwareVersion: 3.1 },
  powerMeter: { manufacturerId: 255, productId: 9, serialNumber: 700_912, softwareVersion: 1.2 },
};

/** Writes a row as the code before the migration stored it: serials and clock times everywhere. */
async function storeTheOldWay(submissionId: number) {
  const start = 1_795_000_000;
  const { result } = await db('submissions').where({ id: submissionId }).first('result');
  const oldResult = {
    ...result,
    devices: { a: OLD_DEVICE, b: OLD_DEVICE },
    recordings: {
      a: { recordCount: 3600, startTime: start, endTime: start + 3600 },
      b: { recordCount: 3600, startTime: start, endTime: start + 3600 },
    },
    alignment: { ...result.alignment, startTime: start, endTime: start + 3600 },
  };
  await db('submissions')
    .where({ id: submissionId })
    .update({ result: JSON.stringify(oldResult) });
  const recordings = await db('submission_recordings').where({ submission_id: submissionId }).select('id', 'stream');
  for (const r of recordings) {
    const body = gunzipSync(r.stream);
    const headerLength = body.readUInt32LE(0);
    const header = { ...JSON.parse(body.subarray(4, 4 + headerLength).toString('utf8')), device: OLD_DEVICE };
    const newHeader = Buffer.from(JSON.stringify(header));
    const length = Buffer.alloc(4);
    length.writeUInt32LE(newHeader.length, 0);
    await db('submission_recordings')
      .where({ id: r.id })
      .update({
        device_info: JSON.stringify(OLD_DEVICE),
        recording_stats: JSON.stringify({
          recordCount: 3600,
          startTime: start,
          endTime: start + 3600,
          medianIntervalSeconds: 1,
          longGapCount: 0,
          longGapSeconds: 0,
        }),
        stream: gzipSync(Buffer.concat([length, newHeader, body.subarray(4 + headerLength)])),
      });
  }
}

describe('the migration that strips serial numbers and clock times', () => {
  it('when rows carry serial numbers and clock times, then afterwards none are left and the stream still decodes', async () => {
    const rider = await ensureUser(db, { handle: 'old-rows-rider', name: 'Old Rows' });
    const { id } = await submissionAwaitingReview(db, rider.id, await createCatalogue(db));
    const before = await db('submission_recordings').where({ submission_id: id }).orderBy('side').select('stream');
    await storeTheOldWay(id);

    await migration.up(db);
    await migration.down();

    const { result } = await db('submissions').where({ id }).first('result');
    expect(result).not.toHaveProperty('devices');
    expect(result).not.toHaveProperty('recordings');
    expect(result.alignment).not.toHaveProperty('startTime');
    expect(result.alignment.overlapSeconds).toBeGreaterThan(0);
    const recordings = await db('submission_recordings')
      .where({ submission_id: id })
      .orderBy('side')
      .select('device_info', 'recording_stats', 'stream');
    for (const [i, r] of recordings.entries()) {
      expect(r.device_info.creator).toEqual({ manufacturerId: 255, productId: 7, serialNumber: null, softwareVersion: 3.1 });
      expect(r.device_info.powerMeter.serialNumber).toBeNull();
      expect(r.recording_stats).toEqual({
        recordCount: 3600,
        durationSeconds: 3600,
        medianIntervalSeconds: 1,
        longGapCount: 0,
        longGapSeconds: 0,
      });
      const after = decodeStream(r.stream);
      expect(after.device.powerMeter?.serialNumber).toBeNull();
      expect(after.powerWatts).toEqual(decodeStream(before[i].stream).powerWatts);
    }
    expect(JSON.stringify(recordings.map((r) => [r.device_info, r.recording_stats]))).not.toMatch(/300417|700912/);
  });
});
