// Rate-limit counters shared by every API instance on this database (middleware/rate-limit-store.ts).
import type { MigrationInterface, QueryRunner } from 'typeorm';

const TABLE_OPTIONS = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

export class RateLimits1764913310000 implements MigrationInterface {
  name = 'RateLimits1764913310000';

  async up(q: QueryRunner): Promise<void> {
    // The key is the SHA-256 of "<scope><limiter>:<client key>": fixed width, and no e-mail
    // address, IP address or token hash sits in the table in a readable form.
    // One fixed window per key; the index lets the sweep find lapsed rows without a full scan.
    await q.query(`CREATE TABLE rate_limit_counter (
      key_hash BINARY(32) NOT NULL,
      hits INT UNSIGNED NOT NULL,
      window_ends_at DATETIME(3) NOT NULL,
      PRIMARY KEY (key_hash),
      KEY ix_rate_limit_counter_window (window_ends_at)
    ) ${TABLE_OPTIONS}`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE rate_limit_counter');
  }
}
