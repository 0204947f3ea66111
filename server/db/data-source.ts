import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { entities } from './entities';
import { migrations } from './migrations';

export function createDataSource(url: string, opts: { logging?: boolean } = {}): DataSource {
  return new DataSource({
    type: 'postgres',
    url,
    entities,
    migrations,
    synchronize: false,
    migrationsRun: false,
    logging: opts.logging ? ['error', 'warn', 'migration'] : ['error'],
    uuidExtension: 'pgcrypto',
    // A connection that cannot be made in 5 s fails (the API answers 503) instead of waiting forever.
    extra: { max: 10, connectionTimeoutMillis: 5000 },
  });
}

/** The default export is what the TypeORM CLI loads (migration:generate, migration:run). */
export default createDataSource(
  process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54329/placewright_dev',
);
