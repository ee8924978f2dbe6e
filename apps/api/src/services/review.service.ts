// The network's side of onboarding: the review queue, the review checklist and notes, and the
// decisions that move an organisation through its statuses. Network admins only.
import type { z } from 'zod';
import {
  DECISION_TRANSITIONS,
  type ApplicationReview,
  type ApplicationSummary,
  type Country,
  type DecisionSchema,
  type OrganisationStatus,
  type ReviewChecklist,
} from '@emberline/domain';
import { OrganisationEntity, PartnerProfileEntity } from '../entities';
import type { ServiceContext } from '../lib/context';
import { createError } from '../lib/errors';
import { enqueueMail } from '../mail/outbox';
import { listAudit } from './admin.service';
import { audit } from './audit.service';
import { notifyCoverageAlerts } from './coverage.service';
import { buildApplication, lockOrganisation } from './onboarding.service';
import { consoleLinks, partnerAdminsOf } from './recipients';

export const InvalidTransition = createError('INVALID_TRANSITION', 409, 'This decision is not possible in the current status');
export const NotSubmitted = createError('NOT_SUBMITTED', 409, 'This application has not been submitted yet');

const DAY_MS = 86_400_000;
/** Statuses in which an application waits for the network. */
const WAITING: readonly OrganisationStatus[] = ['submitted', 'in_review'];

export interface ApplicationFilter {
  status?: OrganisationStatus;
  country?: Country;
  q?: string;
  sort: 'waiting' | 'name' | 'submitted';
  order?: 'asc' | 'desc';
}

const likePattern = (q: string) => `%${q.replace(/[%_\\]/g, '\\$&')}%`;

export async function listApplications(ctx: ServiceContext, filter: ApplicationFilter, now = new Date()): Promise<ApplicationSummary[]> {
  const qb = ctx.manager
    .getRepository(OrganisationEntity)
    .createQueryBuilder('o')
    .leftJoin(PartnerProfileEntity, 'p', 'p.organisation_id = o.id')
    .select(['o.id AS id', 'o.name AS name', 'o.status AS status', 'p.trading_name AS trading_name', 'p.country AS country', 'p.city AS city', 'p.submitted_at AS submitted_at'])
    .addSelect(
      "(SELECT DATE_FORMAT(MAX(d.expires_on), '%Y-%m-%d') FROM partner_document d WHERE d.organisation_id = o.id AND d.kind = 'insurance' AND d.deleted_at IS NULL)",
      'insurance_expires_on',
    );
  if (filter.status) qb.andWhere('o.status = :status', { status: filter.status });
  if (filter.country) qb.andWhere('p.country = :country', { country: filter.country });
  if (filter.q) {
    qb.andWhere('(o.name LIKE :q OR p.trading_name LIKE :q OR p.legal_name LIKE :q OR p.city LIKE :q)', { q: likePattern(filter.q) });
  }
  // "waiting" puts the longest wait first by default; empty dates always go last
  const defaultOrder = filter.sort === 'name' ? 'asc' : 'desc';
  const order = (filter.order ?? defaultOrder).toUpperCase() as 'ASC' | 'DESC';
  if (filter.sort === 'name') qb.orderBy('COALESCE(p.trading_name, o.name)', order);
  else {
    const submittedOrder = filter.sort === 'waiting' ? (order === 'ASC' ? 'DESC' : 'ASC') : order;
    // those waiting for the network come first whichever way; an approved partner has not waited since
    if (filter.sort === 'waiting') qb.orderBy('o.status IN (:...waiting)', 'DESC').setParameter('waiting', WAITING);
    qb.addOrderBy('p.submitted_at IS NULL', 'ASC').addOrderBy('p.submitted_at', submittedOrder);
  }
  qb.addOrderBy('o.id', 'ASC');
  const rows: { id: string; name: string; status: OrganisationStatus; trading_name: string | null; country: string | null; city: string | null; submitted_at: Date | null; insurance_expires_on: string | null }[] =
    await qb.getRawMany();
  return rows.map((r) => {
    const submittedAt = r.submitted_at ? new Date(r.submitted_at) : null;
    return {
      organisationId: r.id,
      tradingName: r.trading_name ?? r.name,
      country: r.country,
      city: r.city,
      status: r.status,
      submittedAt: submittedAt?.toISOString() ?? null,
      waitingDays: submittedAt && WAITING.includes(r.status) ? Math.max(0, Math.floor((now.getTime() - submittedAt.getTime()) / DAY_MS)) : null,
      insuranceExpiresOn: r.insurance_expires_on,
    };
  });
}

export async function getReview(ctx: ServiceContext, organisationId: string, today: string): Promise<ApplicationReview> {
  const application = await buildApplication(ctx.manager, organisationId, today);
  const profile = await ctx.manager.getRepository(PartnerProfileEntity).findOneBy({ organisationId });
  return {
    application,
    checklist: profile?.reviewChecklist ?? null,
    internalNotes: profile?.internalNotes ?? '',
    history: await listAudit(ctx, { organisationId, limit: 200 }),
  };
}

export async function updateReview(ctx: ServiceContext, organisationId: string, input: { checklist: ReviewChecklist; internalNotes: string }): Promise<void> {
  const org = await lockOrganisation(ctx.manager, organisationId);
  if (org.status === 'draft') throw NotSubmitted('The partner is still filling in the application.');
  const profiles = ctx.manager.getRepository(PartnerProfileEntity);
  const profile = await profiles.findOneBy({ organisationId });
  if (!profile) throw NotSubmitted('The partner has not entered any details yet.');
  await profiles.update({ organisationId }, { reviewChecklist: input.checklist, internalNotes: input.internalNotes });
  // opening the review takes the application out of the untouched queue
  const status = org.status === 'submitted' ? 'in_review' : org.status;
  if (status !== org.status) await ctx.manager.getRepository(OrganisationEntity).update({ id: organisationId }, { status });
  await audit(ctx, {
    action: 'application.review',
    entityType: 'organisation',
    entityId: organisationId,
    organisationId,
    before: { status: org.status, checklist: profile.reviewChecklist, internalNotes: profile.internalNotes },
    after: { status, checklist: input.checklist, internalNotes: input.internalNotes },
  });
}

type DecisionInput = z.output<typeof DecisionSchema>;

const AUDIT_ACTION: Record<DecisionInput['decision'], string> = {
  approve: 'application.approve',
  request_changes: 'application.request-changes',
  reject: 'application.reject',
  suspend: 'organisation.suspend',
  reinstate: 'organisation.reinstate',
};

export async function decide(ctx: ServiceContext, organisationId: string, input: DecisionInput, o: { publicUrl: string }): Promise<void> {
  const org = await lockOrganisation(ctx.manager, organisationId);
  const transition = DECISION_TRANSITIONS[input.decision];
  if (!transition.from.includes(org.status)) {
    throw InvalidTransition(`"${input.decision.replace('_', ' ')}" is possible only from ${transition.from.join(' or ')}; the organisation is ${org.status.replace('_', ' ')}.`);
  }
  const profiles = ctx.manager.getRepository(PartnerProfileEntity);
  const profile = await profiles.findOneBy({ organisationId });
  const statusReason = input.decision === 'reject' || input.decision === 'suspend' ? input.message : null;
  await ctx.manager.getRepository(OrganisationEntity).update({ id: organisationId }, { status: transition.to, statusReason });
  const changeRequest = input.decision === 'request_changes' ? { message: input.message, fields: input.fields, requestedAt: new Date() } : null;
  if (changeRequest) {
    if (!profile) await profiles.insert({ organisationId });
    await profiles.update({ organisationId }, { changeRequestMessage: changeRequest.message, changeRequestFields: changeRequest.fields, changeRequestedAt: changeRequest.requestedAt });
  }
  await audit(ctx, {
    action: AUDIT_ACTION[input.decision],
    entityType: 'organisation',
    entityId: organisationId,
    organisationId,
    before: { status: org.status, statusReason: org.statusReason },
    after: { status: transition.to, statusReason, ...(changeRequest ? { changeRequest: { message: changeRequest.message, fields: changeRequest.fields } } : {}) },
  });

  const organisationName = profile?.tradingName ?? org.name;
  const link = consoleLinks.application(o.publicUrl);
  for (const admin of await partnerAdminsOf(ctx.manager, organisationId)) {
    const base = { to: admin.email, locale: admin.locale };
    const who = { name: admin.name, organisationName };
    switch (input.decision) {
      case 'approve':
        await enqueueMail(ctx.manager, { ...base, template: 'application-approved', data: { ...who, link } });
        break;
      case 'request_changes':
        await enqueueMail(ctx.manager, { ...base, template: 'application-changes-requested', data: { ...who, message: input.message, link } });
        break;
      case 'reject':
        await enqueueMail(ctx.manager, { ...base, template: 'application-rejected', data: { ...who, message: input.message } });
        break;
      case 'suspend':
        await enqueueMail(ctx.manager, { ...base, template: 'organisation-suspended', data: { ...who, reason: input.message, link } });
        break;
      case 'reinstate':
        await enqueueMail(ctx.manager, { ...base, template: 'organisation-reinstated', data: { ...who, link } });
        break;
    }
  }
  // listed again (or for the first time): owners waiting in its area for what it can do hear now
  if (transition.to === 'approved') await notifyCoverageAlerts(ctx.manager, organisationId, { publicUrl: o.publicUrl });
}
