// Accounts, organisations (tenants), memberships, sessions, one-time tokens, invitations,
// the audit log and the e-mail outbox.
import type { MigrationInterface, QueryRunner } from 'typeorm';

const TABLE_OPTIONS = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

export class Accounts1764630000000 implements MigrationInterface {
  name = 'Accounts1764630000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE user_account (
      id CHAR(36) NOT NULL,
      email VARCHAR(254) NOT NULL,
      name VARCHAR(120) NOT NULL,
      password_hash VARCHAR(100) NOT NULL,
      locale VARCHAR(5) NOT NULL DEFAULT 'en',
      is_owner TINYINT(1) NOT NULL DEFAULT 0,
      is_network_admin TINYINT(1) NOT NULL DEFAULT 0,
      email_verified_at DATETIME(3) NULL,
      failed_sign_ins SMALLINT UNSIGNED NOT NULL DEFAULT 0,
      locked_until DATETIME(3) NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      UNIQUE KEY uq_user_account_email (email)
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE organisation (
      id CHAR(36) NOT NULL,
      name VARCHAR(120) NOT NULL,
      status VARCHAR(24) NOT NULL DEFAULT 'draft',
      status_reason VARCHAR(500) NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      KEY ix_organisation_status (status)
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE membership (
      organisation_id CHAR(36) NOT NULL,
      user_id CHAR(36) NOT NULL,
      role VARCHAR(24) NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (organisation_id, user_id),
      KEY ix_membership_user (user_id),
      CONSTRAINT fk_membership_organisation FOREIGN KEY (organisation_id) REFERENCES organisation (id) ON DELETE CASCADE,
      CONSTRAINT fk_membership_user FOREIGN KEY (user_id) REFERENCES user_account (id) ON DELETE CASCADE
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE refresh_token (
      id CHAR(36) NOT NULL,
      user_id CHAR(36) NOT NULL,
      family_id CHAR(36) NOT NULL,
      token_hash CHAR(64) NOT NULL,
      expires_at DATETIME(3) NOT NULL,
      used_at DATETIME(3) NULL,
      revoked_at DATETIME(3) NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      UNIQUE KEY uq_refresh_token_hash (token_hash),
      KEY ix_refresh_token_family (family_id),
      KEY ix_refresh_token_user (user_id),
      CONSTRAINT fk_refresh_token_user FOREIGN KEY (user_id) REFERENCES user_account (id) ON DELETE CASCADE
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE one_time_token (
      id CHAR(36) NOT NULL,
      user_id CHAR(36) NOT NULL,
      purpose VARCHAR(24) NOT NULL,
      token_hash CHAR(64) NOT NULL,
      expires_at DATETIME(3) NOT NULL,
      used_at DATETIME(3) NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      UNIQUE KEY uq_one_time_token_hash (token_hash),
      KEY ix_one_time_token_user (user_id, purpose),
      CONSTRAINT fk_one_time_token_user FOREIGN KEY (user_id) REFERENCES user_account (id) ON DELETE CASCADE
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE invitation (
      id CHAR(36) NOT NULL,
      organisation_id CHAR(36) NOT NULL,
      email VARCHAR(254) NOT NULL,
      role VARCHAR(24) NOT NULL,
      token_hash CHAR(64) NOT NULL,
      invited_by_user_id CHAR(36) NOT NULL,
      expires_at DATETIME(3) NOT NULL,
      accepted_at DATETIME(3) NULL,
      revoked_at DATETIME(3) NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      UNIQUE KEY uq_invitation_token_hash (token_hash),
      KEY ix_invitation_organisation (organisation_id),
      CONSTRAINT fk_invitation_organisation FOREIGN KEY (organisation_id) REFERENCES organisation (id) ON DELETE CASCADE,
      CONSTRAINT fk_invitation_inviter FOREIGN KEY (invited_by_user_id) REFERENCES user_account (id) ON DELETE CASCADE
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE audit_log (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
      actor_user_id CHAR(36) NULL,
      action VARCHAR(64) NOT NULL,
      entity_type VARCHAR(48) NOT NULL,
      entity_id VARCHAR(64) NULL,
      organisation_id CHAR(36) NULL,
      before_state JSON NULL,
      after_state JSON NULL,
      ip VARCHAR(45) NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      KEY ix_audit_log_entity (entity_type, entity_id),
      KEY ix_audit_log_actor (actor_user_id),
      KEY ix_audit_log_created (created_at)
    ) ${TABLE_OPTIONS}`);
    await q.query(`CREATE TABLE mail_outbox (
      id CHAR(36) NOT NULL,
      to_address VARCHAR(254) NOT NULL,
      template VARCHAR(48) NOT NULL,
      locale VARCHAR(5) NOT NULL,
      subject VARCHAR(300) NOT NULL,
      text_body MEDIUMTEXT NOT NULL,
      html_body MEDIUMTEXT NOT NULL,
      status VARCHAR(12) NOT NULL DEFAULT 'pending',
      attempts SMALLINT UNSIGNED NOT NULL DEFAULT 0,
      next_attempt_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      last_error VARCHAR(500) NULL,
      message_id VARCHAR(300) NULL,
      sent_at DATETIME(3) NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      KEY ix_mail_outbox_due (status, next_attempt_at),
      KEY ix_mail_outbox_created (created_at)
    ) ${TABLE_OPTIONS}`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const table of ['mail_outbox', 'audit_log', 'invitation', 'one_time_token', 'refresh_token', 'membership', 'organisation', 'user_account']) {
      await q.query(`DROP TABLE ${table}`);
    }
  }
}
