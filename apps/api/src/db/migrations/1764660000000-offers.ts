// What partners sell: offers per service type with their technicians and parts kit, the parts
// themselves, the travel policy, and each technician's working hours.
import type { MigrationInterface, QueryRunner } from 'typeorm';

const TABLE_OPTIONS = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';
const CURRENCY_CHECK = "IN ('EUR', 'SEK', 'NOK', 'DKK', 'CHF')";

export class Offers1764660000000 implements MigrationInterface {
  name = 'Offers1764660000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE offer (
      id CHAR(36) NOT NULL,
      organisation_id CHAR(36) NOT NULL,
      service_type_id INT UNSIGNED NOT NULL,
      price_minor BIGINT NOT NULL,
      currency CHAR(3) NOT NULL,
      duration_minutes SMALLINT UNSIGNED NOT NULL,
      deposit JSON NOT NULL,
      cancellation JSON NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      UNIQUE KEY uq_offer_organisation_service_type (organisation_id, service_type_id),
      KEY ix_offer_service_type (service_type_id),
      CONSTRAINT fk_offer_organisation FOREIGN KEY (organisation_id) REFERENCES organisation (id) ON DELETE CASCADE,
      CONSTRAINT fk_offer_service_type FOREIGN KEY (service_type_id) REFERENCES service_type (id),
      CONSTRAINT ck_offer_price CHECK (price_minor >= 0),
      CONSTRAINT ck_offer_currency CHECK (currency ${CURRENCY_CHECK})
    ) ${TABLE_OPTIONS}`);
    // a technician leaves the offer when they leave the organisation
    await q.query(`CREATE TABLE offer_technician (
      offer_id CHAR(36) NOT NULL,
      organisation_id CHAR(36) NOT NULL,
      user_id CHAR(36) NOT NULL,
      PRIMARY KEY (offer_id, user_id),
      KEY ix_offer_technician_member (organisation_id, user_id),
      CONSTRAINT fk_offer_technician_offer FOREIGN KEY (offer_id) REFERENCES offer (id) ON DELETE CASCADE,
      CONSTRAINT fk_offer_technician_membership FOREIGN KEY (organisation_id, user_id) REFERENCES membership (organisation_id, user_id) ON DELETE CASCADE
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE part (
      id CHAR(36) NOT NULL,
      organisation_id CHAR(36) NOT NULL,
      name VARCHAR(120) NOT NULL,
      part_type VARCHAR(60) NOT NULL,
      unit_price_minor BIGINT NOT NULL,
      currency CHAR(3) NOT NULL,
      stock INT UNSIGNED NOT NULL DEFAULT 0,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      KEY ix_part_organisation (organisation_id),
      CONSTRAINT fk_part_organisation FOREIGN KEY (organisation_id) REFERENCES organisation (id) ON DELETE CASCADE,
      CONSTRAINT ck_part_price CHECK (unit_price_minor >= 0),
      CONSTRAINT ck_part_currency CHECK (currency ${CURRENCY_CHECK})
    ) ${TABLE_OPTIONS}`);
    // a part in a kit cannot be deleted (the API answers 409 first)
    await q.query(`CREATE TABLE offer_part (
      offer_id CHAR(36) NOT NULL,
      part_id CHAR(36) NOT NULL,
      quantity SMALLINT UNSIGNED NOT NULL,
      PRIMARY KEY (offer_id, part_id),
      KEY ix_offer_part_part (part_id),
      CONSTRAINT fk_offer_part_offer FOREIGN KEY (offer_id) REFERENCES offer (id) ON DELETE CASCADE,
      CONSTRAINT fk_offer_part_part FOREIGN KEY (part_id) REFERENCES part (id) ON DELETE RESTRICT,
      CONSTRAINT ck_offer_part_quantity CHECK (quantity BETWEEN 1 AND 99)
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE travel_policy (
      organisation_id CHAR(36) NOT NULL,
      free_within_km SMALLINT UNSIGNED NOT NULL,
      rate_per_km_minor BIGINT NOT NULL,
      currency CHAR(3) NOT NULL,
      max_distance_km SMALLINT UNSIGNED NOT NULL,
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      PRIMARY KEY (organisation_id),
      CONSTRAINT fk_travel_policy_organisation FOREIGN KEY (organisation_id) REFERENCES organisation (id) ON DELETE CASCADE,
      CONSTRAINT ck_travel_policy_rate CHECK (rate_per_km_minor >= 0),
      CONSTRAINT ck_travel_policy_currency CHECK (currency ${CURRENCY_CHECK})
    ) ${TABLE_OPTIONS}`);
    // hours: JSON validated by WorkingHoursSchema before it is written
    await q.query(`CREATE TABLE working_hours (
      organisation_id CHAR(36) NOT NULL,
      user_id CHAR(36) NOT NULL,
      hours JSON NOT NULL,
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      PRIMARY KEY (organisation_id, user_id),
      CONSTRAINT fk_working_hours_membership FOREIGN KEY (organisation_id, user_id) REFERENCES membership (organisation_id, user_id) ON DELETE CASCADE
    ) ${TABLE_OPTIONS}`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const table of ['working_hours', 'travel_policy', 'offer_part', 'part', 'offer_technician', 'offer']) await q.query(`DROP TABLE ${table}`);
  }
}
