// A partner's application: the steps it fills in, the documents it uploads, and submitting it
// for review. Every query is scoped by the organisation the caller acts in.
import { createHash } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';
import { In, IsNull, type EntityManager } from 'typeorm';
import type { z } from 'zod';
import {
  applicationMissing,
  AreaStepSchema,
  BusinessStepSchema,
  EDITABLE_STATUSES,
  UPLOAD_TYPES,
  type Application,
  type CapabilitiesStep,
  type DocumentKind,
  type FieldError,
  type OrganisationStatus,
  type PartnerDocument,
} from '@emberline/domain';
import { CapabilityEntity, OrganisationCapabilityEntity, OrganisationEntity, PartnerDocumentEntity, PartnerProfileEntity } from '../entities';
import type { ServiceContext } from '../lib/context';
import { createError, NotFound, ValidationFailed } from '../lib/errors';
import { newId } from '../lib/secure-token';
import { enqueueMail } from '../mail/outbox';
import { audit } from './audit.service';
import { consoleLinks, networkAdmins } from './recipients';

export const NotEditable = createError('NOT_EDITABLE', 409, 'The application cannot be changed now');
export const UnsupportedMediaType = createError('UNSUPPORTED_MEDIA_TYPE', 415, 'This type of file is not accepted');
/** The status reason the insurance check writes; a new certificate sends such a partner back to review. */
export const INSURANCE_EXPIRED = 'insurance expired';

type UploadType = (typeof UPLOAD_TYPES)[number];

/** Today's date in UTC, YYYY-MM-DD: expiry dates are calendar dates compared in UTC. */
export const todayUtc = (now = new Date()): string => now.toISOString().slice(0, 10);

function orgOf(ctx: ServiceContext): string {
  if (!ctx.actor.organisationId) throw new Error('onboarding service called outside an organisation scope');
  return ctx.actor.organisationId;
}

export const isEditable = (status: OrganisationStatus): boolean => EDITABLE_STATUSES.includes(status);

/** The organisation row, locked for the rest of the transaction so status changes happen one at a time. */
export async function lockOrganisation(manager: EntityManager, organisationId: string): Promise<OrganisationEntity> {
  const org = await manager.getRepository(OrganisationEntity).findOne({ where: { id: organisationId }, lock: { mode: 'pessimistic_write' } });
  if (!org) throw NotFound('There is no such organisation.');
  return org;
}

async function ensureProfile(manager: EntityManager, organisationId: string): Promise<PartnerProfileEntity> {
  const profiles = manager.getRepository(PartnerProfileEntity);
  const existing = await profiles.findOneBy({ organisationId });
  if (existing) return existing;
  await profiles.insert({ organisationId });
  return profiles.findOneByOrFail({ organisationId });
}

function assertEditable(org: OrganisationEntity): void {
  if (!isEditable(org.status)) {
    throw NotEditable(`The application is ${org.status.replace('_', ' ')}: it can be changed only while it is a draft or changes were requested.`);
  }
}

export function toDocument(d: PartnerDocumentEntity): PartnerDocument {
  return {
    id: d.id,
    kind: d.kind,
    fileName: d.fileName,
    contentType: d.contentType as UploadType,
    sizeBytes: d.sizeBytes,
    expiresOn: d.expiresOn,
    capabilityCode: d.capabilityCode,
    uploadedAt: d.createdAt.toISOString(),
  };
}

function businessOf(p: PartnerProfileEntity | null): Application['business'] {
  if (!p?.legalName) return null;
  return {
    legalName: p.legalName,
    tradingName: p.tradingName ?? undefined,
    country: (p.country ?? undefined) as NonNullable<Application['business']>['country'],
    street: p.street ?? undefined,
    postalCode: p.postalCode ?? undefined,
    city: p.city ?? undefined,
    vatId: p.vatId,
    phone: p.phone ?? undefined,
  };
}

function areaOf(p: PartnerProfileEntity | null): Application['area'] {
  if (!p || p.baseLat === null || p.baseLng === null || !p.mode) return null;
  return { baseLabel: p.baseLabel ?? '', baseLat: p.baseLat, baseLng: p.baseLng, mode: p.mode, radiusKm: p.radiusKm, workshopAddress: p.workshopAddress };
}

/** The whole application of one organisation as the partner (and the reviewing admin) sees it. */
export async function buildApplication(manager: EntityManager, organisationId: string, today: string): Promise<Application> {
  const org = await manager.getRepository(OrganisationEntity).findOneBy({ id: organisationId });
  if (!org) throw NotFound('There is no such organisation.');
  const profile = await manager.getRepository(PartnerProfileEntity).findOneBy({ organisationId });
  const claims = await manager.getRepository(OrganisationCapabilityEntity).find({ where: { organisationId }, relations: { capability: true } });
  claims.sort((a, b) => a.capability.category.localeCompare(b.capability.category) || a.capability.name.localeCompare(b.capability.name));
  const documents = await manager.getRepository(PartnerDocumentEntity).find({ where: { organisationId, deletedAt: IsNull() }, order: { createdAt: 'ASC', id: 'ASC' } });
  const parts = {
    business: businessOf(profile),
    area: areaOf(profile),
    capabilities: claims.map((c) => ({ code: c.capability.code, name: c.capability.name, category: c.capability.category, notes: c.notes, serial: c.serial })),
    documents: documents.map(toDocument),
  };
  const retired = claims.filter((c) => c.capability.retired).map((c) => c.capability.code);
  return {
    organisationId,
    status: org.status,
    statusReason: org.statusReason,
    ...parts,
    changeRequest:
      profile?.changeRequestMessage != null && profile.changeRequestedAt
        ? { message: profile.changeRequestMessage, fields: profile.changeRequestFields ?? {}, requestedAt: profile.changeRequestedAt.toISOString() }
        : null,
    missing: applicationMissing(parts, retired, today),
    submittedAt: profile?.submittedAt?.toISOString() ?? null,
    editable: isEditable(org.status),
  };
}

export function getApplication(ctx: ServiceContext, today: string): Promise<Application> {
  return buildApplication(ctx.manager, orgOf(ctx), today);
}

export async function saveBusiness(ctx: ServiceContext, input: z.output<typeof BusinessStepSchema>, today: string): Promise<Application> {
  const organisationId = orgOf(ctx);
  assertEditable(await lockOrganisation(ctx.manager, organisationId));
  const profile = await ensureProfile(ctx.manager, organisationId);
  const before = businessOf(profile);
  const after = { ...input, vatId: input.vatId ?? null };
  await ctx.manager.getRepository(PartnerProfileEntity).update({ organisationId }, after);
  await audit(ctx, { action: 'application.save-business', entityType: 'organisation', entityId: organisationId, organisationId, before, after });
  return buildApplication(ctx.manager, organisationId, today);
}

export async function saveArea(ctx: ServiceContext, input: z.output<typeof AreaStepSchema>, today: string): Promise<Application> {
  const organisationId = orgOf(ctx);
  assertEditable(await lockOrganisation(ctx.manager, organisationId));
  const profile = await ensureProfile(ctx.manager, organisationId);
  const before = areaOf(profile);
  // a workshop may keep a radius (where its customers come from); a mobile-only partner has no workshop
  const after = {
    baseLabel: input.baseLabel,
    baseLat: input.baseLat,
    baseLng: input.baseLng,
    mode: input.mode,
    radiusKm: input.radiusKm,
    workshopAddress: input.mode === 'mobile' ? null : (input.workshopAddress ?? null),
  };
  await ctx.manager.getRepository(PartnerProfileEntity).update({ organisationId }, after);
  await audit(ctx, { action: 'application.save-area', entityType: 'organisation', entityId: organisationId, organisationId, before, after });
  return buildApplication(ctx.manager, organisationId, today);
}

export async function saveCapabilities(ctx: ServiceContext, input: CapabilitiesStep, today: string): Promise<Application> {
  const organisationId = orgOf(ctx);
  assertEditable(await lockOrganisation(ctx.manager, organisationId));
  const codes = input.capabilities.map((c) => c.code);
  const catalogue = new Map((await ctx.manager.getRepository(CapabilityEntity).findBy({ code: In(codes) })).map((c) => [c.code, c]));
  const errors: FieldError[] = [];
  const seen = new Set<string>();
  input.capabilities.forEach((claim, index) => {
    const capability = catalogue.get(claim.code);
    if (!capability) errors.push({ path: `capabilities.${index}.code`, message: `There is no "${claim.code}" in the catalogue` });
    else if (capability.retired) errors.push({ path: `capabilities.${index}.code`, message: `"${capability.name}" is no longer offered in the catalogue` });
    else if (seen.has(claim.code)) errors.push({ path: `capabilities.${index}.code`, message: 'This equipment is listed twice' });
    seen.add(claim.code);
  });
  if (errors.length) throw ValidationFailed('Please correct the highlighted fields.', errors);

  const claims = ctx.manager.getRepository(OrganisationCapabilityEntity);
  const before = (await claims.find({ where: { organisationId }, relations: { capability: true } })).map((c) => c.capability.code).sort();
  await claims.delete({ organisationId });
  await claims.insert(
    input.capabilities.map((c) => ({ organisationId, capabilityId: catalogue.get(c.code)!.id, notes: c.notes?.trim() || null, serial: c.serial?.trim() || null })),
  );
  await audit(ctx, { action: 'application.save-capabilities', entityType: 'organisation', entityId: organisationId, organisationId, before: { capabilities: before }, after: { capabilities: [...codes].sort() } });
  return buildApplication(ctx.manager, organisationId, today);
}

// --- documents --------------------------------------------------------------------------------

export interface SniffedUpload {
  contentType: UploadType;
  sha256: string;
  sizeBytes: number;
}

/** The type is read from the bytes, never from the name or the header the client sent. */
export async function sniffUpload(buffer: Buffer): Promise<SniffedUpload> {
  const detected = await fileTypeFromBuffer(buffer);
  if (!detected || !(UPLOAD_TYPES as readonly string[]).includes(detected.mime)) {
    throw UnsupportedMediaType(`Upload a PDF, JPEG, PNG or WebP file${detected ? ` (this file is ${detected.mime})` : ''}.`);
  }
  return { contentType: detected.mime as UploadType, sha256: createHash('sha256').update(buffer).digest('hex'), sizeBytes: buffer.length };
}

const EXTENSIONS: Record<UploadType, string[]> = {
  'application/pdf': ['pdf'],
  'image/jpeg': ['jpg', 'jpeg'],
  'image/png': ['png'],
  'image/webp': ['webp'],
};

/** A file name safe to show and to send back in Content-Disposition, with the extension of its real type. */
export function sanitiseFileName(original: string | undefined, contentType: UploadType): string {
  const base = (original ?? '').split(/[\\/]/).pop() ?? '';
  let name = base
    .normalize('NFC')
    .replace(/[\p{Cc}\p{Cf}"<>:|?*;\\]/gu, '')
    .replace(/\s+/g, ' ')
    .trim()
    .replace(/^[.\s]+/, '');
  const extensions = EXTENSIONS[contentType];
  const dot = name.lastIndexOf('.');
  const stem = dot > 0 ? name.slice(0, dot) : name;
  const extension = dot > 0 ? name.slice(dot + 1).toLowerCase() : '';
  name = `${(stem || 'document').slice(0, 100)}.${extensions.includes(extension) ? extension : extensions[0]}`;
  return name;
}

export interface NewDocument extends SniffedUpload {
  kind: DocumentKind;
  expiresOn?: string;
  capabilityCode?: string;
  fileName: string;
  storageKey: string;
}

/** Statuses in which an insurance certificate may be replaced outside the editable ones. */
function insuranceRenewal(org: OrganisationEntity): boolean {
  return org.status === 'approved' || (org.status === 'suspended' && org.statusReason === INSURANCE_EXPIRED);
}

/**
 * Records an uploaded (already stored) document. A new valid insurance certificate from an
 * approved partner, or one suspended because its insurance expired, sends it back for review.
 */
export async function addDocument(ctx: ServiceContext, input: NewDocument, o: { publicUrl: string }): Promise<PartnerDocument> {
  const organisationId = orgOf(ctx);
  const org = await lockOrganisation(ctx.manager, organisationId);
  const renewal = input.kind === 'insurance' && insuranceRenewal(org);
  if (!renewal) assertEditable(org);
  if (input.capabilityCode) {
    const capability = await ctx.manager.getRepository(CapabilityEntity).findOneBy({ code: input.capabilityCode });
    if (!capability || capability.retired) {
      throw ValidationFailed('Please correct the highlighted fields.', [{ path: 'capabilityCode', message: `There is no "${input.capabilityCode}" in the catalogue` }]);
    }
  }
  const documents = ctx.manager.getRepository(PartnerDocumentEntity);
  const id = newId();
  await documents.insert({
    id,
    organisationId,
    kind: input.kind,
    fileName: input.fileName,
    storageKey: input.storageKey,
    contentType: input.contentType,
    sizeBytes: input.sizeBytes,
    sha256: input.sha256,
    expiresOn: input.expiresOn ?? null,
    capabilityCode: input.capabilityCode ?? null,
    uploadedBy: ctx.actor.userId,
    deletedAt: null,
  });
  const saved = await documents.findOneByOrFail({ id });
  await audit(ctx, {
    action: 'document.upload',
    entityType: 'partner_document',
    entityId: id,
    organisationId,
    after: { kind: saved.kind, fileName: saved.fileName, contentType: saved.contentType, sizeBytes: saved.sizeBytes, sha256: saved.sha256, expiresOn: saved.expiresOn },
  });
  if (renewal) {
    const before = { status: org.status, statusReason: org.statusReason };
    await ctx.manager.getRepository(OrganisationEntity).update({ id: organisationId }, { status: 'submitted', statusReason: null });
    await ensureProfile(ctx.manager, organisationId);
    await ctx.manager.getRepository(PartnerProfileEntity).update({ organisationId }, { submittedAt: new Date() });
    await audit(ctx, { action: 'application.resubmit-insurance', entityType: 'organisation', entityId: organisationId, organisationId, before, after: { status: 'submitted', statusReason: null, documentId: id } });
    await notifyNetworkAdmins(ctx.manager, org, o.publicUrl);
  }
  return toDocument(saved);
}

/** Marks a document deleted and returns its storage key, for the caller to remove once committed. */
export async function deleteDocument(ctx: ServiceContext, documentId: string): Promise<string> {
  const organisationId = orgOf(ctx);
  const org = await lockOrganisation(ctx.manager, organisationId);
  const documents = ctx.manager.getRepository(PartnerDocumentEntity);
  const doc = await documents.findOneBy({ id: documentId, organisationId, deletedAt: IsNull() });
  if (!doc) throw NotFound('There is no such document.');
  assertEditable(org);
  await documents.update({ id: doc.id }, { deletedAt: new Date() });
  await audit(ctx, { action: 'document.delete', entityType: 'partner_document', entityId: doc.id, organisationId, before: { kind: doc.kind, fileName: doc.fileName, sha256: doc.sha256 } });
  return doc.storageKey;
}

/** A document of the caller's organisation (members and network admins), for streaming its file. */
export async function findDocument(ctx: ServiceContext, documentId: string): Promise<PartnerDocumentEntity> {
  const doc = await ctx.manager.getRepository(PartnerDocumentEntity).findOneBy({ id: documentId, organisationId: orgOf(ctx), deletedAt: IsNull() });
  if (!doc) throw NotFound('There is no such document.');
  return doc;
}

// --- submitting -------------------------------------------------------------------------------

async function notifyNetworkAdmins(manager: EntityManager, org: OrganisationEntity, publicUrl: string): Promise<void> {
  const profile = await manager.getRepository(PartnerProfileEntity).findOneBy({ organisationId: org.id });
  const organisationName = profile?.tradingName ?? org.name;
  for (const admin of await networkAdmins(manager)) {
    await enqueueMail(manager, { to: admin.email, template: 'application-submitted', locale: admin.locale, data: { organisationName, link: consoleLinks.review(publicUrl, org.id) } });
  }
}

export async function submitApplication(ctx: ServiceContext, o: { today: string; publicUrl: string }): Promise<Application> {
  const organisationId = orgOf(ctx);
  const org = await lockOrganisation(ctx.manager, organisationId);
  assertEditable(org);
  const application = await buildApplication(ctx.manager, organisationId, o.today);
  if (application.missing.length) throw ValidationFailed('Complete the application before you submit it.', application.missing);
  await ctx.manager.getRepository(OrganisationEntity).update({ id: organisationId }, { status: 'submitted', statusReason: null });
  await ctx.manager.getRepository(PartnerProfileEntity).update(
    { organisationId },
    { submittedAt: new Date(), changeRequestMessage: null, changeRequestFields: null, changeRequestedAt: null },
  );
  await audit(ctx, { action: 'application.submit', entityType: 'organisation', entityId: organisationId, organisationId, before: { status: org.status }, after: { status: 'submitted' } });
  await notifyNetworkAdmins(ctx.manager, org, o.publicUrl);
  return buildApplication(ctx.manager, organisationId, o.today);
}
