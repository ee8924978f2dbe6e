// How long before its appointment a job may be started: a network setting, so the operator can
// widen it without a release (the rule itself is jobStartWindow in the domain).
import type { MigrationInterface, QueryRunner } from 'typeorm';

export class JobStartWindow1764951000000 implements MigrationInterface {
  name = 'JobStartWindow1764951000000';

  async up(q: QueryRunner): Promise<void> {
    // INSERT IGNORE keeps a value an operator set before
    await q.query(
      `INSERT IGNORE INTO network_setting (setting_key, value, description) VALUES
        ('job-start-window', '{"minutes":120}', 'How many minutes before the appointment a technician may start the job (never before the appointment''s local day).')`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query("DELETE FROM network_setting WHERE setting_key = 'job-start-window'");
  }
}
