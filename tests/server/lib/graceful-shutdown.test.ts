import { describe, expect, it } from 'vitest';
import { createShutdown } from '../../../server/lib/graceful-shutdown';

describe('the shutdown path', () => {
  it('when stop is called several times, then each step runs once, newest first, and the process exits once', async () => {
    const ran: string[] = [];
    const exits: number[] = [];
    const shutdown = createShutdown({ log: () => {}, exit: (code) => exits.push(code) });
    shutdown.add('PostgreSQL', () => ran.push('postgres'));
    shutdown.add('the server', async () => ran.push('server'));

    await Promise.all([shutdown.stop(0), shutdown.stop(0), shutdown.stop(1)]);

    expect(ran).toEqual(['server', 'postgres']);
    expect(exits).toEqual([0]);
  });

  it('when a step hangs or fails, then the later steps still run after its bound', async () => {
    const ran: string[] = [];
    const lines: string[] = [];
    const shutdown = createShutdown({ log: (line) => lines.push(line), exit: () => {} });
    shutdown.add('PostgreSQL', () => ran.push('postgres'));
    shutdown.add('the queue', () => {
      throw new Error('connection lost');
    });
    shutdown.add('the server', () => new Promise(() => {}), 50);

    await shutdown.stop();

    expect(ran).toEqual(['postgres']);
    expect(lines).toEqual(['the server did not stop within 0.05 s; going on.', 'Stopping the queue failed: connection lost']);
  });
});
