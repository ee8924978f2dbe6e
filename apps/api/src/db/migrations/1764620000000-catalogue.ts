// Platform catalogues: capabilities, service types and which capabilities each service type requires.
import type { MigrationInterface, QueryRunner } from 'typeorm';

const TABLE_OPTIONS = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

export class Catalogue1764620000000 implements MigrationInterface {
  name = 'Catalogue1764620000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE capability (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT,
      code VARCHAR(64) NOT NULL,
      name VARCHAR(120) NOT NULL,
      description TEXT NOT NULL,
      category VARCHAR(32) NOT NULL,
      standards JSON NOT NULL,
      retired TINYINT(1) NOT NULL DEFAULT 0,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      UNIQUE KEY uq_capability_code (code)
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE service_type (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT,
      code VARCHAR(64) NOT NULL,
      name VARCHAR(120) NOT NULL,
      summary VARCHAR(300) NOT NULL,
      description TEXT NOT NULL,
      default_duration_minutes SMALLINT UNSIGNED NOT NULL,
      cautions JSON NOT NULL,
      sort_order SMALLINT NOT NULL DEFAULT 0,
      retired TINYINT(1) NOT NULL DEFAULT 0,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      UNIQUE KEY uq_service_type_code (code),
      CONSTRAINT ck_service_type_duration CHECK (default_duration_minutes BETWEEN 15 AND 1440)
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE service_type_capability (
      service_type_id INT UNSIGNED NOT NULL,
      capability_id INT UNSIGNED NOT NULL,
      PRIMARY KEY (service_type_id, capability_id),
      KEY ix_service_type_capability_capability (capability_id),
      CONSTRAINT fk_stc_service_type FOREIGN KEY (service_type_id) REFERENCES service_type (id) ON DELETE CASCADE,
      CONSTRAINT fk_stc_capability FOREIGN KEY (capability_id) REFERENCES capability (id) ON DELETE RESTRICT
    ) ${TABLE_OPTIONS}`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE service_type_capability');
    await q.query('DROP TABLE service_type');
    await q.query('DROP TABLE capability');
  }
}
