// Seeds the demo scenario's people and organisations, and the organisations' applications
// (profile, equipment, documents). Idempotent: looks people up by e-mail and organisations by
// name, and adds only what is missing.
import { createHash } from 'node:crypto';
import { In, type EntityManager } from 'typeorm';
import {
  CapabilityEntity,
  MembershipEntity,
  OrganisationCapabilityEntity,
  OrganisationEntity,
  PartnerDocumentEntity,
  PartnerProfileEntity,
  UserAccountEntity,
  VehicleEntity,
} from '../../entities';
import { hashPassword } from '../../lib/password-hash';
import { newId } from '../../lib/secure-token';
import type { Storage } from '../../storage';
import { DEMO_NETWORK_ADMINS, DEMO_ORGANISATIONS, DEMO_OWNERS, DEMO_PASSWORD, DEMO_VEHICLES, type DemoOrganisation, type DemoPerson } from './demo-data';
import { minimalPdf } from './minimal-pdf';
import { seedDemoOffers } from './demo-offers';
import { seedDemoBookings } from './demo-bookings';

export interface DemoSeedReport {
  usersAdded: number;
  organisationsAdded: number;
  profilesAdded: number;
  documentsAdded: number;
}

const DAY_MS = 86_400_000;
const dayFrom = (today: Date, days: number) => new Date(today.getTime() + days * DAY_MS).toISOString().slice(0, 10);

/** Profile, claimed equipment and documents of one demo organisation, each only if it has none yet. */
async function seedApplication(
  manager: EntityManager,
  org: OrganisationEntity,
  demo: DemoOrganisation,
  o: { storage?: Storage; now: Date; adminId: string | null },
): Promise<{ profile: boolean; documents: number }> {
  const added = { profile: false, documents: 0 };
  const profiles = manager.getRepository(PartnerProfileEntity);
  if (!(await profiles.existsBy({ organisationId: org.id }))) {
    await profiles.insert({ organisationId: org.id, tradingName: demo.name, ...demo.profile, submittedAt: new Date(o.now.getTime() + demo.submittedDays * DAY_MS) });
    added.profile = true;
  }
  const claims = manager.getRepository(OrganisationCapabilityEntity);
  if (!(await claims.existsBy({ organisationId: org.id }))) {
    const capabilities = await manager.getRepository(CapabilityEntity).findBy({ code: In(demo.capabilities) });
    if (capabilities.length !== demo.capabilities.length) throw new Error(`Seed: ${demo.name} claims a capability the catalogue does not have`);
    await claims.insert(capabilities.map((c) => ({ organisationId: org.id, capabilityId: c.id, notes: null, serial: null })));
  }
  const documents = manager.getRepository(PartnerDocumentEntity);
  if (o.storage && !(await documents.existsBy({ organisationId: org.id }))) {
    const insuranceExpires = dayFrom(o.now, demo.insuranceDays);
    const files = [
      { kind: 'insurance' as const, fileName: 'liability-insurance.pdf', expiresOn: insuranceExpires, lines: [`${demo.profile.legalName}`, 'Certificate of liability insurance (demo)', `Valid until ${insuranceExpires}`] },
      { kind: 'registration' as const, fileName: 'business-registration.pdf', expiresOn: null, lines: [`${demo.profile.legalName}`, 'Business registration extract (demo)', `${demo.profile.street}, ${demo.profile.postalCode} ${demo.profile.city}`] },
    ];
    for (const file of files) {
      const bytes = minimalPdf(file.lines);
      const storageKey = await o.storage.put(bytes);
      await documents.insert({
        id: newId(),
        organisationId: org.id,
        kind: file.kind,
        fileName: file.fileName,
        storageKey,
        contentType: 'application/pdf',
        sizeBytes: bytes.length,
        sha256: createHash('sha256').update(bytes).digest('hex'),
        expiresOn: file.expiresOn,
        capabilityCode: null,
        uploadedBy: o.adminId,
        createdAt: new Date(o.now.getTime() + (demo.submittedDays - 1) * DAY_MS),
        deletedAt: null,
      });
      added.documents++;
    }
  }
  return added;
}

/** `storage` receives the demo documents; without it they are left out. */
export async function seedDemo(manager: EntityManager, passwordHashCost: number, o: { storage?: Storage; now?: Date } = {}): Promise<DemoSeedReport> {
  const users = manager.getRepository(UserAccountEntity);
  const orgs = manager.getRepository(OrganisationEntity);
  const memberships = manager.getRepository(MembershipEntity);
  const report: DemoSeedReport = { usersAdded: 0, organisationsAdded: 0, profilesAdded: 0, documentsAdded: 0 };
  const now = o.now ?? new Date();
  let passwordHash: string | undefined;

  const created = new Set<string>();
  async function person(p: DemoPerson, flags: Partial<UserAccountEntity>): Promise<UserAccountEntity> {
    const existing = await users.findOneBy({ email: p.email });
    if (existing) return existing;
    created.add(p.email);
    passwordHash ??= await hashPassword(DEMO_PASSWORD, passwordHashCost);
    report.usersAdded++;
    return users.save(
      users.create({
        id: newId(),
        email: p.email,
        name: p.name,
        locale: p.locale ?? 'en',
        passwordHash,
        isOwner: false,
        isNetworkAdmin: false,
        emailVerifiedAt: new Date(),
        lockedUntil: null,
        ...flags,
      }),
    );
  }

  for (const admin of DEMO_NETWORK_ADMINS) await person(admin, { isNetworkAdmin: true });
  const vehicles = manager.getRepository(VehicleEntity);
  for (const owner of DEMO_OWNERS) {
    const user = await person(owner, { isOwner: true });
    // vehicles are seeded together with their owner only, so later edits are never undone
    if (created.has(owner.email)) {
      for (const v of DEMO_VEHICLES[owner.email] ?? []) await vehicles.insert({ id: newId(), ownerUserId: user.id, ...v });
    }
  }
  for (const demo of DEMO_ORGANISATIONS) {
    let org = await orgs.findOneBy({ name: demo.name });
    if (!org) {
      org = await orgs.save({ id: newId(), name: demo.name, status: demo.status, statusReason: demo.statusReason ?? null });
      report.organisationsAdded++;
    }
    let adminId: string | null = null;
    for (const member of demo.members) {
      const user = await person(member, {});
      if (member.role === 'partner_admin') adminId ??= user.id;
      if (!(await memberships.existsBy({ organisationId: org.id, userId: user.id }))) {
        await memberships.insert({ organisationId: org.id, userId: user.id, role: member.role });
      }
    }
    const added = await seedApplication(manager, org, demo, { storage: o.storage, now, adminId });
    if (added.profile) report.profilesAdded++;
    report.documentsAdded += added.documents;
  }
  await seedDemoOffers(manager, now);
  await seedDemoBookings(manager, now);
  return report;
}
