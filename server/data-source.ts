import { DataSource } from 'typeorm';
import { readConfig } from './config';
import { DB_APPLICATION_NAME, DB_CONNECT_TIMEOUT_MS, poolErrorLogger } from './db-health';
import { entities } from './entities';
import { Register1764641000000 } from './migrations/1764641000000-register';
import { Sync1764900000000 } from './migrations/1764900000000-sync';
import { SyncLeanRecord1764990000000 } from './migrations/1764990000000-sync-lean-record';
import { ConditionRecord1765200000000 } from './migrations/1765200000000-condition-record';
import { Access1765300000000 } from './migrations/1765300000000-access';
import { ExactNumbers1765410000000 } from './migrations/1765410000000-exact-numbers';
import { ArcFlashLabel1765440000000 } from './migrations/1765440000000-arc-flash-label';
import { ReplayGuardPerUser1765420000000 } from './migrations/1765420000000-replay-guard-per-user';
import { Judgements1765413000000 } from './migrations/1765413000000-judgements';
import { PanelChecks1765430000000 } from './migrations/1765430000000-panel-checks';
import { FieldMetaLz41765450000000 } from './migrations/1765450000000-field-meta-lz4';

export function makeDataSource(url = readConfig().DATABASE_URL): DataSource {
  return new DataSource({
    type: 'postgres',
    url,
    entities,
    migrations: [
      Register1764641000000,
      Sync1764900000000,
      SyncLeanRecord1764990000000,
      ConditionRecord1765200000000,
      Access1765300000000,
      ExactNumbers1765410000000,
      Judgements1765413000000,
      ReplayGuardPerUser1765420000000,
      PanelChecks1765430000000,
      ArcFlashLabel1765440000000,
      FieldMetaLz41765450000000,
    ],
    synchronize: false,
    logging: false,
    // TypeORM's own pool: its default error handler logs through TypeORM's logger, which is off;
    // ours keeps the broken connection visible in the server log
    poolErrorHandler: poolErrorLogger('typeorm'),
    applicationName: DB_APPLICATION_NAME,
    extra: { max: 10, connectionTimeoutMillis: DB_CONNECT_TIMEOUT_MS },
  });
}

/** The one DataSource the TypeORM CLI reads. */
export const dataSource = makeDataSource();
