// The daily insurance check: approved partners hear 30, 7 and 1 days before their liability
// insurance certificate expires (and on the day), and are suspended once it has expired.
import type { DataSource, EntityManager } from 'typeorm';
import { daysBetween, reminderThreshold } from '@emberline/domain';
import { InsuranceReminderEntity, OrganisationEntity, PartnerProfileEntity } from '../entities';
import type { Logger } from '../lib/logger';
import { ANONYMOUS } from '../lib/context';
import { enqueueMail } from '../mail/outbox';
import { audit } from './audit.service';
import { INSURANCE_EXPIRED } from './onboarding.service';
import { consoleLinks, networkAdmins, partnerAdminsOf } from './recipients';

/** Named MariaDB lock: with several API instances only one runs the check at a time. */
export const INSURANCE_LOCK = 'emberline.insurance-expiry';

export interface InsuranceExpiryOptions {
  dataSource: DataSource;
  /** The run's date, YYYY-MM-DD (UTC). */
  today: string;
  publicUrl: string;
  logger?: Logger;
}

export interface InsuranceExpiryResult {
  reminders: number;
  suspended: number;
  /** True when another process held the lock, so this run did nothing. */
  skipped: boolean;
}


async function organisationName(manager: EntityManager, org: OrganisationEntity): Promise<string> {
  const profile = await manager.getRepository(PartnerProfileEntity).findOneBy({ organisationId: org.id });
  return profile?.tradingName ?? org.name;
}

/** Sends a reminder unless one was sent for this certificate and threshold; true when it did. */
async function remind(manager: EntityManager, row: { organisationId: string; documentId: string; expiresOn: string }, daysBefore: number, publicUrl: string): Promise<boolean> {
  const inserted = await manager
    .createQueryBuilder()
    .insert()
    .into(InsuranceReminderEntity)
    .values({ documentId: row.documentId, daysBefore, organisationId: row.organisationId })
    .orIgnore()
    .execute();
  // MariaDB answers with the inserted rows (INSERT … RETURNING); an ignored duplicate returns none
  const raw = inserted.raw as unknown[] | { affectedRows?: number };
  const affected = Array.isArray(raw) ? raw.length : (raw.affectedRows ?? 0);
  if (affected !== 1) return false;
  const org = await manager.getRepository(OrganisationEntity).findOneByOrFail({ id: row.organisationId });
  const name = await organisationName(manager, org);
  for (const admin of await partnerAdminsOf(manager, row.organisationId)) {
    await enqueueMail(manager, {
      to: admin.email,
      template: 'insurance-expiring',
      locale: admin.locale,
      data: { name: admin.name, organisationName: name, expiresOn: row.expiresOn, link: consoleLinks.application(publicUrl) },
    });
  }
  return true;
}

/** Suspends an organisation whose insurance expired, if it is still approved; true when it did. */
async function suspend(manager: EntityManager, organisationId: string, expiresOn: string, publicUrl: string): Promise<boolean> {
  const org = await manager.getRepository(OrganisationEntity).findOne({ where: { id: organisationId }, lock: { mode: 'pessimistic_write' } });
  if (!org || org.status !== 'approved') return false;
  await manager.getRepository(OrganisationEntity).update({ id: organisationId }, { status: 'suspended', statusReason: INSURANCE_EXPIRED });
  // the system acts here, not a person: the audit entry has no actor
  await audit({ manager, actor: ANONYMOUS }, {
    action: 'organisation.suspend',
    entityType: 'organisation',
    entityId: organisationId,
    organisationId,
    before: { status: org.status, statusReason: org.statusReason },
    after: { status: 'suspended', statusReason: INSURANCE_EXPIRED, insuranceExpiredOn: expiresOn },
  });
  const name = await organisationName(manager, org);
  for (const admin of await partnerAdminsOf(manager, organisationId)) {
    await enqueueMail(manager, {
      to: admin.email,
      template: 'organisation-suspended',
      locale: admin.locale,
      data: { name: admin.name, organisationName: name, reason: INSURANCE_EXPIRED, link: consoleLinks.application(publicUrl) },
    });
  }
  for (const admin of await networkAdmins(manager)) {
    await enqueueMail(manager, {
      to: admin.email,
      template: 'partner-suspended',
      locale: admin.locale,
      data: { organisationName: name, reason: INSURANCE_EXPIRED, link: consoleLinks.review(publicUrl, organisationId) },
    });
  }
  return true;
}

/**
 * Checks every approved organisation's latest insurance certificate once. Holds `GET_LOCK` on one
 * dedicated connection for the whole run; each organisation is handled in its own transaction,
 * so one failure does not undo the others.
 */
export async function runInsuranceExpiry(options: InsuranceExpiryOptions): Promise<InsuranceExpiryResult> {
  const { dataSource, today, publicUrl, logger } = options;
  const result: InsuranceExpiryResult = { reminders: 0, suspended: 0, skipped: false };
  const runner = dataSource.createQueryRunner();
  let locked = false;
  try {
    await runner.connect();
    const rows: { locked: number | string | null }[] = await runner.query('SELECT GET_LOCK(?, 0) AS locked', [INSURANCE_LOCK]);
    locked = Number(rows[0]?.locked) === 1;
    if (!locked) return { ...result, skipped: true };

    // the certificate that counts is the one that runs longest (a renewal may be uploaded early)
    const latest: { organisation_id: string; document_id: string | null; expires_on: string | null }[] = await runner.query(
      `SELECT o.id AS organisation_id, d.id AS document_id, DATE_FORMAT(d.expires_on, '%Y-%m-%d') AS expires_on
         FROM organisation o
         LEFT JOIN partner_document d ON d.id = (
           SELECT d2.id FROM partner_document d2
            WHERE d2.organisation_id = o.id AND d2.kind = 'insurance' AND d2.deleted_at IS NULL AND d2.expires_on IS NOT NULL
            ORDER BY d2.expires_on DESC, d2.created_at DESC LIMIT 1)
        WHERE o.status = 'approved'
        ORDER BY o.id`,
    );
    for (const row of latest) {
      if (!row.document_id || !row.expires_on) {
        logger?.warn({ organisationId: row.organisation_id }, 'approved organisation without an insurance certificate');
        continue;
      }
      const daysLeft = daysBetween(today, row.expires_on);
      const item = { organisationId: row.organisation_id, documentId: row.document_id, expiresOn: row.expires_on };
      try {
        if (daysLeft < 0) {
          if (await runner.manager.transaction((m) => suspend(m, row.organisation_id, row.expires_on!, publicUrl))) result.suspended++;
        } else {
          const threshold = reminderThreshold(daysLeft);
          if (threshold !== null && (await runner.manager.transaction((m) => remind(m, item, threshold, publicUrl)))) result.reminders++;
        }
      } catch (err) {
        logger?.error({ organisationId: row.organisation_id, error: (err as Error).message }, 'insurance check failed for an organisation');
      }
    }
    return result;
  } finally {
    if (locked) {
      await runner.query('SELECT RELEASE_LOCK(?)', [INSURANCE_LOCK]).catch((err: unknown) => {
        logger?.warn({ error: (err as Error).message }, 'could not release the insurance check lock');
      });
    }
    await runner.release();
  }
}
