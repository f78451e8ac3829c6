import pino from 'pino';
import pretty from 'pino-pretty';
import { readConfig, type Config } from './config';

export type LogFormat = 'json' | 'pretty';

/**
 * JSON lines in production (a log collector reads them), readable lines elsewhere; LOG_FORMAT
 * overrides either way (`npm start` runs with NODE_ENV=production and asks for `pretty`: a person
 * reads that terminal).
 */
export function logFormatFor(config: Pick<Config, 'NODE_ENV' | 'LOG_FORMAT'>): LogFormat {
  return config.LOG_FORMAT ?? (config.NODE_ENV === 'production' ? 'json' : 'pretty');
}

function makeLogger() {
  const config = readConfig();
  const options = { level: config.LOG_LEVEL, base: undefined };
  if (logFormatFor(config) === 'json') return pino(options);
  // synchronous, in this thread: a short script (scripts/db.ts) exits before a worker would flush
  return pino(options, pretty({ sync: true, colorize: Boolean(process.stdout.isTTY), translateTime: 'SYS:HH:MM:ss', ignore: 'pid,hostname' }));
}

export const logger = makeLogger();
