import pino from 'pino';
import { readConfig } from './config';

export const logger = pino({ level: readConfig().LOG_LEVEL, base: undefined });
