import { availableParallelism } from 'node:os';
import type { Worker } from 'node:worker_threads';
import Piscina from 'piscina';
import { AnalysisError } from '@shared/analysis/errors';
import type { ComparisonResult, CompareOptions } from '@shared/analysis/types';
import { tsxExecArgv } from '../../lib/tsx-exec-argv';
import type { PreparedRecording, RecordingTask, TaskOutcome } from './recording-tasks.worker';

// A small pool of worker threads for decoding uploads and analysing pairs, off the
// web process's event loop. Each task has a time limit and each thread a heap limit,
// so no file, however built, can stall or kill the server: the task fails instead.

/** Generous: a 25 MB file decodes in about a second on one core. */
export const TASK_TIME_LIMIT_MS = 60_000;
const HEAP_LIMIT_MB = 1024;

/** A task that ran out of time or memory, or whose thread died. */
export class RecordingTaskError extends Error {
  constructor(
    readonly reason: 'time' | 'memory' | 'crash',
    cause: unknown,
  ) {
    super(`recording task failed (${reason})`, { cause });
    this.name = 'RecordingTaskError';
  }
}

/** Why a pool task failed: piscina's abort on our time limit, the thread's heap limit, or anything else that killed it. */
export function taskFailureReason(err: unknown): RecordingTaskError['reason'] {
  const code = (err as { code?: string }).code;
  const name = (err as { name?: string }).name;
  if (name === 'AbortError' || name === 'TimeoutError') return 'time';
  if (code === 'ERR_WORKER_OUT_OF_MEMORY') return 'memory';
  return 'crash';
}

let pool: Piscina<RecordingTask, TaskOutcome<unknown>> | null = null;

function recordingPool() {
  pool ??= new Piscina<RecordingTask, TaskOutcome<unknown>>({
    filename: new URL('./recording-tasks.worker.ts', import.meta.url).href,
    execArgv: tsxExecArgv(),
    minThreads: 0,
    maxThreads: Math.max(2, availableParallelism()),
    idleTimeout: 30_000,
    resourceLimits: { maxOldGenerationSizeMb: HEAP_LIMIT_MB },
  });
  return pool;
}

async function run<T>(task: RecordingTask, timeLimitMs: number): Promise<T> {
  let outcome: TaskOutcome<unknown>;
  try {
    outcome = await recordingPool().run(task, { signal: AbortSignal.timeout(timeLimitMs) });
  } catch (err) {
    throw new RecordingTaskError(taskFailureReason(err), err);
  }
  if (!outcome.ok) throw new AnalysisError(outcome.error.code, outcome.error.message);
  return outcome.value as T;
}

/** Decodes and checks one uploaded file; throws AnalysisError for a file the engine cannot use. */
export function prepareRecording(bytes: Uint8Array, timeLimitMs = TASK_TIME_LIMIT_MS): Promise<PreparedRecording> {
  return run<PreparedRecording>({ kind: 'prepare', bytes }, timeLimitMs).then((prepared) => ({
    ...prepared,
    stored: Buffer.from(prepared.stored),
  }));
}

/** Runs the engine on two stored streams. */
export function compareStoredRecordings(a: Uint8Array, b: Uint8Array, options: CompareOptions): Promise<ComparisonResult> {
  return run<ComparisonResult>({ kind: 'compare', a, b, options }, TASK_TIME_LIMIT_MS);
}

/** The pool's threads now (none before the first task and after closing); for the tests of the shutdown. */
export function recordingTaskThreads(): readonly Worker[] {
  return pool?.threads ?? [];
}

/** Lets running tasks finish, then ends the threads; part of every process's shutdown. */
export async function closeRecordingTasks(): Promise<void> {
  const closing = pool;
  pool = null;
  await closing?.close();
}
