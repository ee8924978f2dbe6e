// The per-account failure counter gave way to the sign-in throttle (sign_in_throttle), which
// counts per address and client IP; nothing reads the old column any more.
import type { MigrationInterface, QueryRunner } from 'typeorm';

export class DropFailedSignIns1764930000000 implements MigrationInterface {
  name = 'DropFailedSignIns1764930000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE user_account DROP COLUMN failed_sign_ins');
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE user_account ADD COLUMN failed_sign_ins SMALLINT UNSIGNED NOT NULL DEFAULT 0 AFTER email_verified_at');
  }
}
