// Partner onboarding: the application profile of an organisation, the capabilities it claims,
// its uploaded documents and the insurance reminders already sent.
import type { MigrationInterface, QueryRunner } from 'typeorm';

const TABLE_OPTIONS = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

export class Onboarding1764650000000 implements MigrationInterface {
  name = 'Onboarding1764650000000';

  async up(q: QueryRunner): Promise<void> {
    // one row per organisation; a step counts as saved when its required columns are set
    await q.query(`CREATE TABLE partner_profile (
      organisation_id CHAR(36) NOT NULL,
      legal_name VARCHAR(160) NULL,
      trading_name VARCHAR(120) NULL,
      country CHAR(2) NULL,
      street VARCHAR(160) NULL,
      postal_code VARCHAR(16) NULL,
      city VARCHAR(100) NULL,
      vat_id VARCHAR(20) NULL,
      phone VARCHAR(32) NULL,
      base_label VARCHAR(120) NULL,
      base_lat DOUBLE NULL,
      base_lng DOUBLE NULL,
      mode VARCHAR(12) NULL,
      radius_km SMALLINT UNSIGNED NULL,
      workshop_address VARCHAR(240) NULL,
      submitted_at DATETIME(3) NULL,
      change_request_message TEXT NULL,
      change_request_fields JSON NULL,
      change_requested_at DATETIME(3) NULL,
      review_checklist JSON NULL,
      internal_notes TEXT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      PRIMARY KEY (organisation_id),
      KEY ix_partner_profile_country (country),
      KEY ix_partner_profile_submitted (submitted_at),
      CONSTRAINT fk_partner_profile_organisation FOREIGN KEY (organisation_id) REFERENCES organisation (id) ON DELETE CASCADE,
      CONSTRAINT ck_partner_profile_mode CHECK (mode IS NULL OR mode IN ('mobile', 'workshop', 'both'))
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE organisation_capability (
      organisation_id CHAR(36) NOT NULL,
      capability_id INT UNSIGNED NOT NULL,
      notes VARCHAR(500) NULL,
      serial VARCHAR(80) NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (organisation_id, capability_id),
      KEY ix_organisation_capability_capability (capability_id),
      CONSTRAINT fk_organisation_capability_organisation FOREIGN KEY (organisation_id) REFERENCES organisation (id) ON DELETE CASCADE,
      CONSTRAINT fk_organisation_capability_capability FOREIGN KEY (capability_id) REFERENCES capability (id)
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE partner_document (
      id CHAR(36) NOT NULL,
      organisation_id CHAR(36) NOT NULL,
      kind VARCHAR(16) NOT NULL,
      file_name VARCHAR(160) NOT NULL,
      storage_key VARCHAR(64) NOT NULL,
      content_type VARCHAR(64) NOT NULL,
      size_bytes INT UNSIGNED NOT NULL,
      sha256 CHAR(64) NOT NULL,
      expires_on DATE NULL,
      capability_code VARCHAR(64) NULL,
      uploaded_by CHAR(36) NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      deleted_at DATETIME(3) NULL,
      PRIMARY KEY (id),
      UNIQUE KEY uq_partner_document_storage_key (storage_key),
      KEY ix_partner_document_organisation (organisation_id, kind, deleted_at),
      CONSTRAINT fk_partner_document_organisation FOREIGN KEY (organisation_id) REFERENCES organisation (id) ON DELETE CASCADE,
      CONSTRAINT fk_partner_document_uploader FOREIGN KEY (uploaded_by) REFERENCES user_account (id) ON DELETE SET NULL,
      CONSTRAINT ck_partner_document_kind CHECK (kind IN ('insurance', 'registration', 'qualification', 'evidence'))
    ) ${TABLE_OPTIONS}`);
    // the primary key makes each reminder (document, threshold) happen once, whatever runs it
    await q.query(`CREATE TABLE insurance_reminder (
      document_id CHAR(36) NOT NULL,
      days_before TINYINT UNSIGNED NOT NULL,
      organisation_id CHAR(36) NOT NULL,
      sent_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (document_id, days_before),
      KEY ix_insurance_reminder_organisation (organisation_id),
      CONSTRAINT fk_insurance_reminder_document FOREIGN KEY (document_id) REFERENCES partner_document (id) ON DELETE CASCADE,
      CONSTRAINT fk_insurance_reminder_organisation FOREIGN KEY (organisation_id) REFERENCES organisation (id) ON DELETE CASCADE,
      CONSTRAINT ck_insurance_reminder_days CHECK (days_before IN (30, 7, 1, 0))
    ) ${TABLE_OPTIONS}`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const table of ['insurance_reminder', 'partner_document', 'organisation_capability', 'partner_profile']) {
      await q.query(`DROP TABLE ${table}`);
    }
  }
}
