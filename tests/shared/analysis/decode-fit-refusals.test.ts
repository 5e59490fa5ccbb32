import { describe, expect, it } from 'vitest';
import { decodeFit, MAX_RECORDING_SPAN_SECONDS, MAX_RECORDS_PER_FILE } from '@shared/analysis/decode-fit';
import { AnalysisError } from '@shared/analysis/errors';
import { toSecondGrid } from '@shared/analysis/timeline';
import { BASE, FILE_TYPE, FIT_EPOCH, FitBytes, MESG, simpleActivity, tinyRecordFile } from '../../../scripts/lib/fit-bytes';
import { rideStream } from './ride-streams';

function refusal(bytes: Uint8Array): AnalysisError {
  try {
    decodeFit(bytes);
  } catch (error) {
    if (error instanceof AnalysisError) return error;
    throw error;
  }
  throw new Error('expected decodeFit to refuse the file');
}

const START = 1_717_225_200;

describe('decodeFit refusals', () => {
  it.each([
    ['settings', FILE_TYPE.settings],
    ['workout', FILE_TYPE.workout],
    ['monitoring', FILE_TYPE.monitoringB],
  ])('when the file is a FIT %s file, then it is refused as not_activity, naming the kind', (name, fileType) => {
    const error = refusal(simpleActivity({ seconds: 900, fileType }));

    expect(error.code).toBe('not_activity');
    expect(error.message).toContain(`FIT ${name} file`);
  });

  it('when the file is a FIT file with no file_id and no records, then it is refused as not_activity', () => {
    const bytes = new FitBytes()
      .define(0, MESG.deviceInfo, [[0, BASE.uint8]])
      .data(0, [1])
      .toFile();

    expect(refusal(bytes).code).toBe('not_activity');
  });

  it('when one record lies ten years after the rest, then it is refused as implausible_timestamps, cheaply', () => {
    const bytes = simpleActivity({ seconds: 900, time: (i) => START + i + (i === 10 ? 10 * 365 * 86400 : 0) });

    const error = refusal(bytes);

    expect(error.code).toBe('implausible_timestamps');
    expect(error.message).toMatch(/spans 3,650 days, from 2024-06-01 to 2034-05-30/);
  });

  it('when records lie hours outside the session the file itself gives, then it is refused as implausible_timestamps', () => {
    const fit = new FitBytes()
      .define(0, MESG.fileId, [[0, BASE.enum]])
      .data(0, [FILE_TYPE.activity])
      .define(1, MESG.record, [
        [253, BASE.uint32],
        [7, BASE.uint16],
      ]);
    for (let i = 0; i < 1200; i++) fit.data(1, [START - FIT_EPOCH + i + (i >= 1100 ? 30 * 3600 : 0), 200]);
    fit
      .define(2, MESG.session, [
        [253, BASE.uint32],
        [2, BASE.uint32],
      ])
      .data(2, [START - FIT_EPOCH + 1100, START - FIT_EPOCH]);

    const error = refusal(fit.toFile());

    expect(error.code).toBe('implausible_timestamps');
    expect(error.message).toMatch(/has 100 records dated more than an hour outside the ride's own start and end/);
  });

  it('when the file holds one record more than the cap, then it is refused as too_many_records before the records are read', () => {
    const error = refusal(tinyRecordFile(MAX_RECORDS_PER_FILE + 1));

    expect(error.code).toBe('too_many_records');
    expect(error.message).toMatch(/more than 1,500,000 records/);
  });
});

describe('toSecondGrid bounds', () => {
  it('when a stored stream spans more than the longest plausible ride, then the grid is refused instead of sized by the span', () => {
    const stream = rideStream({ power: [100, 100, 100] });
    stream.timestamps[2] = stream.timestamps[0] + MAX_RECORDING_SPAN_SECONDS + 10;
    stream.recording.endTime = stream.timestamps[2];

    expect(() => toSecondGrid(stream)).toThrow(/spans more than 48 h/);
  });
});
