// The Directory's search: the vehicle rules kept with the catalogue, an index for the search's
// bounding-box prefilter, anonymous coverage gaps and the owners' coverage alerts.
import type { MigrationInterface, QueryRunner } from 'typeorm';

const TABLE_OPTIONS = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

export class Search1764670000000 implements MigrationInterface {
  name = 'Search1764670000000';

  async up(q: QueryRunner): Promise<void> {
    // JSON validated by EligibilityRuleInputSchema before it is written; a deleted rule keeps its
    // row (deleted_at) so the seed does not bring a starting rule back after an admin removed it
    await q.query(`CREATE TABLE eligibility_rule (
      code VARCHAR(64) NOT NULL,
      service_types JSON NOT NULL,
      when_json JSON NOT NULL,
      effect JSON NOT NULL,
      active TINYINT(1) NOT NULL DEFAULT 1,
      sort_order SMALLINT NOT NULL DEFAULT 0,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      deleted_at DATETIME(3) NULL,
      PRIMARY KEY (code),
      KEY ix_eligibility_rule_order (deleted_at, active, sort_order)
    ) ${TABLE_OPTIONS}`);
    // The search's prefilter, an indexed bounding box. Latitude goes in bands of half a degree
    // (~55 km), so a box is a few index ranges on (band, longitude) instead of one range over the
    // whole width of the map at those latitudes; mode and radius ride along, so the per-partner
    // reach is checked in the index before any row is read (index condition pushdown, which
    // MariaDB does not do on a virtual column, hence PERSISTENT). Measured on 10,000 partners:
    // half the database time of an index on (base_lat, base_lng).
    await q.query(`ALTER TABLE partner_profile
      ADD COLUMN base_band SMALLINT AS (FLOOR(base_lat * 2)) PERSISTENT,
      ADD KEY ix_partner_profile_band (base_band, base_lng, base_lat, mode, radius_km)`);
    // a search nobody answered: only the ~10 km cell centre, the service and a rough vehicle
    // class, never the place itself, the person, the vehicle model or the IP address
    await q.query(`CREATE TABLE coverage_gap_search (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
      cell_lat DOUBLE NOT NULL,
      cell_lng DOUBLE NOT NULL,
      service_type_code VARCHAR(64) NOT NULL,
      vehicle_class VARCHAR(48) NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      KEY ix_coverage_gap_search_created (created_at),
      KEY ix_coverage_gap_search_service (service_type_code, created_at),
      CONSTRAINT fk_coverage_gap_search_service_type FOREIGN KEY (service_type_code) REFERENCES service_type (code) ON UPDATE CASCADE
    ) ${TABLE_OPTIONS}`);
    // "tell me when someone covers this": the address is erased (email NULL) once the owner has
    // been told, and waiting alerts are deleted after a year (coverage-retention job)
    await q.query(`CREATE TABLE coverage_alert (
      id CHAR(36) NOT NULL,
      email VARCHAR(254) NULL,
      locale VARCHAR(5) NOT NULL DEFAULT 'en',
      service_type_code VARCHAR(64) NOT NULL,
      cell_lat DOUBLE NOT NULL,
      cell_lng DOUBLE NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      notified_at DATETIME(3) NULL,
      PRIMARY KEY (id),
      KEY ix_coverage_alert_waiting (notified_at, cell_lat, cell_lng),
      KEY ix_coverage_alert_created (created_at),
      CONSTRAINT fk_coverage_alert_service_type FOREIGN KEY (service_type_code) REFERENCES service_type (code) ON UPDATE CASCADE,
      CONSTRAINT ck_coverage_alert_address CHECK (email IS NOT NULL OR notified_at IS NOT NULL)
    ) ${TABLE_OPTIONS}`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE coverage_alert');
    await q.query('DROP TABLE coverage_gap_search');
    await q.query('ALTER TABLE partner_profile DROP KEY ix_partner_profile_band, DROP COLUMN base_band');
    await q.query('DROP TABLE eligibility_rule');
  }
}
