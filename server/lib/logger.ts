import { pino } from 'pino';
import type { Config } from '../config/env';

export function createLogger(config: Pick<Config, 'LOG_LEVEL'>) {
  return pino({ level: config.LOG_LEVEL, base: undefined });
}

export type Logger = ReturnType<typeof createLogger>;
