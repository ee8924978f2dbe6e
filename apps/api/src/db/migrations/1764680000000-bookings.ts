// Bookings and their payments: the booking with its immutable quote snapshot, its history, the
// payment provider's events processed exactly once, the network's settings (commission and the
// processing-fee estimate), each organisation's auto-confirm choice, and e-mail attachments.
import type { MigrationInterface, QueryRunner } from 'typeorm';

const TABLE_OPTIONS = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';
const CURRENCY_CHECK = "IN ('EUR', 'SEK', 'NOK', 'DKK', 'CHF')";
const STATUSES = "('held', 'released', 'requested', 'confirmed', 'in_progress', 'completed', 'declined', 'expired', 'cancelled_by_owner', 'cancelled_by_partner', 'no_show')";
const PAYMENT_STATUSES = "('pending', 'authorised', 'captured', 'cancelled', 'refunded', 'partially_refunded', 'failed')";

export class Bookings1764680000000 implements MigrationInterface {
  name = 'Bookings1764680000000';

  async up(q: QueryRunner): Promise<void> {
    // start_at/end_at are UTC instants; time_zone is the technician's, for the local times shown.
    // quote is the snapshot taken at booking (computeQuote's output) and is never recomputed;
    // kit is the parts kit at booking (what completing the job takes out of stock).
    await q.query(`CREATE TABLE booking (
      id CHAR(36) NOT NULL,
      reference VARCHAR(12) NOT NULL,
      organisation_id CHAR(36) NOT NULL,
      technician_user_id CHAR(36) NOT NULL,
      owner_user_id CHAR(36) NOT NULL,
      offer_id CHAR(36) NULL,
      service_type_id INT UNSIGNED NOT NULL,
      status VARCHAR(24) NOT NULL,
      start_at DATETIME(3) NOT NULL,
      end_at DATETIME(3) NOT NULL,
      time_zone VARCHAR(64) NOT NULL,
      job_at VARCHAR(12) NOT NULL,
      job_lat DOUBLE NOT NULL,
      job_lng DOUBLE NOT NULL,
      address JSON NULL,
      vehicle JSON NOT NULL,
      customer JSON NOT NULL,
      phone VARCHAR(32) NULL,
      notes TEXT NULL,
      quote JSON NOT NULL,
      kit JSON NOT NULL,
      currency CHAR(3) NOT NULL,
      gross_minor BIGINT NOT NULL,
      checkout_session_id VARCHAR(255) NULL,
      checkout_url VARCHAR(1000) NULL,
      payment_intent_id VARCHAR(255) NULL,
      payment_status VARCHAR(24) NOT NULL DEFAULT 'pending',
      authorised_minor BIGINT NOT NULL DEFAULT 0,
      captured_minor BIGINT NOT NULL DEFAULT 0,
      refunded_minor BIGINT NOT NULL DEFAULT 0,
      hold_expires_at DATETIME(3) NULL,
      reminder_sent_at DATETIME(3) NULL,
      calendar_sequence SMALLINT UNSIGNED NOT NULL DEFAULT 0,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      UNIQUE KEY uq_booking_reference (reference),
      KEY ix_booking_technician_start (technician_user_id, start_at),
      KEY ix_booking_organisation_start (organisation_id, start_at),
      KEY ix_booking_owner_start (owner_user_id, start_at),
      KEY ix_booking_status_hold (status, hold_expires_at),
      KEY ix_booking_status_start (status, start_at),
      KEY ix_booking_checkout_session (checkout_session_id),
      KEY ix_booking_payment_intent (payment_intent_id),
      CONSTRAINT fk_booking_organisation FOREIGN KEY (organisation_id) REFERENCES organisation (id),
      CONSTRAINT fk_booking_technician FOREIGN KEY (technician_user_id) REFERENCES user_account (id),
      CONSTRAINT fk_booking_owner FOREIGN KEY (owner_user_id) REFERENCES user_account (id),
      CONSTRAINT fk_booking_offer FOREIGN KEY (offer_id) REFERENCES offer (id) ON DELETE SET NULL,
      CONSTRAINT fk_booking_service_type FOREIGN KEY (service_type_id) REFERENCES service_type (id),
      CONSTRAINT ck_booking_status CHECK (status IN ${STATUSES}),
      CONSTRAINT ck_booking_payment_status CHECK (payment_status IN ${PAYMENT_STATUSES}),
      CONSTRAINT ck_booking_job_at CHECK (job_at IN ('owner', 'workshop')),
      CONSTRAINT ck_booking_times CHECK (end_at > start_at),
      CONSTRAINT ck_booking_currency CHECK (currency ${CURRENCY_CHECK}),
      CONSTRAINT ck_booking_money CHECK (gross_minor >= 0 AND authorised_minor >= 0 AND captured_minor >= 0 AND refunded_minor >= 0 AND refunded_minor <= captured_minor)
    ) ${TABLE_OPTIONS}`);
    // every change of status (and every move of the start, with from = to), oldest first by id
    await q.query(`CREATE TABLE booking_event (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
      booking_id CHAR(36) NOT NULL,
      from_status VARCHAR(24) NULL,
      to_status VARCHAR(24) NOT NULL,
      actor VARCHAR(8) NOT NULL,
      actor_user_id CHAR(36) NULL,
      note VARCHAR(500) NULL,
      at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      KEY ix_booking_event_booking (booking_id, id),
      CONSTRAINT fk_booking_event_booking FOREIGN KEY (booking_id) REFERENCES booking (id) ON DELETE CASCADE,
      CONSTRAINT ck_booking_event_actor CHECK (actor IN ('owner', 'partner', 'system'))
    ) ${TABLE_OPTIONS}`);
    // the provider's event ids: inserted in the same transaction as the event's effect, so a
    // replayed or concurrent delivery of the same event finds the row and changes nothing
    await q.query(`CREATE TABLE payment_event (
      id VARCHAR(255) NOT NULL,
      type VARCHAR(100) NOT NULL,
      booking_id CHAR(36) NULL,
      processed_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      KEY ix_payment_event_booking (booking_id)
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE network_setting (
      setting_key VARCHAR(64) NOT NULL,
      value JSON NOT NULL,
      description VARCHAR(500) NOT NULL,
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      PRIMARY KEY (setting_key)
    ) ${TABLE_OPTIONS}`);
    // every environment needs them from the start; INSERT IGNORE keeps a value changed later
    await q.query(
      `INSERT IGNORE INTO network_setting (setting_key, value, description) VALUES
        ('platform-commission', '{"bp":1200}', 'Platform commission on labour and travel in basis points (12 % = 1200), from the network brief.'),
        ('processing-fee-estimate', '{"percentBp":150,"fixedMinor":25}', 'An estimate of the payment processing fee shown to partners (1.5 % of the gross + 25 minor units); the provider''s statement is what counts.')`,
    );
    // requested bookings of an organisation that auto-confirms are confirmed when paid
    await q.query('ALTER TABLE organisation ADD COLUMN auto_confirm_bookings TINYINT(1) NOT NULL DEFAULT 0');
    // [{ filename, contentType, content (base64) }], e.g. the calendar invitation of a confirmation
    await q.query('ALTER TABLE mail_outbox ADD COLUMN attachments JSON NULL');
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE mail_outbox DROP COLUMN attachments');
    await q.query('ALTER TABLE organisation DROP COLUMN auto_confirm_bookings');
    for (const table of ['network_setting', 'payment_event', 'booking_event', 'booking']) await q.query(`DROP TABLE ${table}`);
  }
}
