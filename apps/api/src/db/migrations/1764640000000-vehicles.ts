// Owners' garages: the vehicles they book work for and plan pre-heating with.
import type { MigrationInterface, QueryRunner } from 'typeorm';

export class Vehicles1764640000000 implements MigrationInterface {
  name = 'Vehicles1764640000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE vehicle (
      id CHAR(36) NOT NULL,
      owner_user_id CHAR(36) NOT NULL,
      name VARCHAR(80) NOT NULL,
      model VARCHAR(120) NOT NULL,
      year SMALLINT UNSIGNED NOT NULL,
      fuel VARCHAR(12) NOT NULL,
      factory_heater VARCHAR(24) NOT NULL,
      climate_control VARCHAR(12) NOT NULL,
      electrical_system_v TINYINT UNSIGNED NOT NULL,
      battery_capacity_ah SMALLINT UNSIGNED NOT NULL,
      battery_type VARCHAR(12) NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      KEY ix_vehicle_owner (owner_user_id),
      CONSTRAINT fk_vehicle_owner FOREIGN KEY (owner_user_id) REFERENCES user_account (id) ON DELETE CASCADE,
      CONSTRAINT ck_vehicle_voltage CHECK (electrical_system_v IN (12, 24))
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE vehicle');
  }
}
