// Password-guessing throttle shared by every API instance, and a token version per account that
// revokes access tokens (services/sign-in-throttle.service.ts, middleware/auth.ts).
import type { MigrationInterface, QueryRunner } from 'typeorm';

const TABLE_OPTIONS = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

export class SignInThrottle1764920000000 implements MigrationInterface {
  name = 'SignInThrottle1764920000000';

  async up(q: QueryRunner): Promise<void> {
    // One row per address and client IP, and one per address alone; the key is a SHA-256, so
    // neither the addresses strangers type (most have no account) nor IPs sit here readably.
    await q.query(`CREATE TABLE sign_in_throttle (
      key_hash BINARY(32) NOT NULL,
      failures INT UNSIGNED NOT NULL,
      last_failure_at DATETIME(3) NOT NULL,
      blocked_until DATETIME(3) NULL,
      PRIMARY KEY (key_hash),
      KEY ix_sign_in_throttle_last_failure (last_failure_at)
    ) ${TABLE_OPTIONS}`);
    // access tokens carry it; a password reset raises it, so older tokens stop working at once
    await q.query('ALTER TABLE user_account ADD COLUMN token_version INT UNSIGNED NOT NULL DEFAULT 0 AFTER locked_until');
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE user_account DROP COLUMN token_version');
    await q.query('DROP TABLE sign_in_throttle');
  }
}
