import { DataSource } from 'typeorm';
import { readConfig } from './config';
import { entities } from './entities';
import { Register1764641000000 } from './migrations/1764641000000-register';

export function makeDataSource(url = readConfig().DATABASE_URL): DataSource {
  return new DataSource({
    type: 'postgres',
    url,
    entities,
    migrations: [Register1764641000000],
    synchronize: false,
    logging: false,
    extra: { max: 10 },
  });
}

/** The one DataSource the TypeORM CLI reads. */
export const dataSource = makeDataSource();
