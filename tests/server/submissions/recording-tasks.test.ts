import { describe, expect, it } from 'vitest';
import { closeRecordingTasks, prepareRecording, recordingTaskThreads } from '../../../server/features/submissions/recording-tasks';
import { cleanPair } from './fit-pairs';

describe('the worker-thread pool of uploads and analyses', () => {
  it('when the pool is closed at shutdown, then every thread that decoded an upload has ended', async () => {
    const pair = cleanPair();
    await Promise.all([prepareRecording(pair.a), prepareRecording(pair.b)]);
    const threads = [...recordingTaskThreads()];
    expect(threads.length).toBeGreaterThan(0);
    expect(threads.every((thread) => thread.threadId > 0)).toBe(true);

    await closeRecordingTasks();

    // Node sets a worker's threadId to -1 once its thread no longer runs.
    expect(threads.map((thread) => thread.threadId)).toEqual(threads.map(() => -1));
    expect(recordingTaskThreads()).toEqual([]);
  });

  it('when a task is asked for after closing, then a new pool serves it', async () => {
    await closeRecordingTasks();

    const prepared = await prepareRecording(cleanPair().a);

    expect(prepared.recording.recordCount).toBeGreaterThan(0);
    await closeRecordingTasks();
  });
});
