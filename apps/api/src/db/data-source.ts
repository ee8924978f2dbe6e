// The TypeORM data source: MariaDB through mysql2, migrations only, UTC, snake_case.
import 'reflect-metadata';
import { DataSource } from 'typeorm';
import type { Config } from '../config';
import { entities } from '../entities';
import { MailQueuedSubscriber } from '../mail/mail-queued';
import { migrations } from './migrations';
import { SnakeNamingStrategy } from './naming-strategy';

export type DbConfig = Pick<Config, 'DB_HOST' | 'DB_PORT' | 'DB_NAME' | 'DB_USER' | 'DB_PASSWORD' | 'DB_POOL_SIZE'>;

export function createDataSource(config: DbConfig): DataSource {
  return new DataSource({
    type: 'mariadb',
    host: config.DB_HOST,
    port: config.DB_PORT,
    username: config.DB_USER,
    password: config.DB_PASSWORD,
    database: config.DB_NAME,
    charset: 'utf8mb4_unicode_ci',
    timezone: 'Z',
    entities,
    // queued mail wakes the sender when its transaction commits
    subscribers: [MailQueuedSubscriber],
    migrations,
    migrationsTableName: 'migrations',
    migrationsRun: false,
    synchronize: false,
    namingStrategy: new SnakeNamingStrategy(),
    poolSize: config.DB_POOL_SIZE,
    connectTimeout: 3000,
    extra: { connectionLimit: config.DB_POOL_SIZE, enableKeepAlive: true },
    logging: false,
  });
}

/** Names of migrations the code knows that the database has not run yet. */
export async function pendingMigrations(ds: DataSource): Promise<string[]> {
  const rows: { name: string }[] = await ds.query('SELECT name FROM migrations').catch((err: { code?: string }) => {
    if (err.code === 'ER_NO_SUCH_TABLE') return [];
    throw err;
  });
  const done = new Set(rows.map((r) => r.name));
  return ds.migrations.map((m) => m.name ?? m.constructor.name).filter((n) => !done.has(n));
}
