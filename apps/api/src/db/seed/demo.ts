// Seeds the demo scenario's people and organisations. Idempotent: looks people up by e-mail
// and organisations by name, and adds only what is missing.
import bcrypt from 'bcryptjs';
import type { EntityManager } from 'typeorm';
import { MembershipEntity, OrganisationEntity, UserAccountEntity, VehicleEntity } from '../../entities';
import { newId } from '../../lib/secure-token';
import { DEMO_NETWORK_ADMINS, DEMO_ORGANISATIONS, DEMO_OWNERS, DEMO_PASSWORD, DEMO_VEHICLES, type DemoPerson } from './demo-data';

export interface DemoSeedReport {
  usersAdded: number;
  organisationsAdded: number;
}

export async function seedDemo(manager: EntityManager, bcryptCost: number): Promise<DemoSeedReport> {
  const users = manager.getRepository(UserAccountEntity);
  const orgs = manager.getRepository(OrganisationEntity);
  const memberships = manager.getRepository(MembershipEntity);
  const report: DemoSeedReport = { usersAdded: 0, organisationsAdded: 0 };
  let passwordHash: string | undefined;

  const created = new Set<string>();
  async function person(p: DemoPerson, flags: Partial<UserAccountEntity>): Promise<UserAccountEntity> {
    const existing = await users.findOneBy({ email: p.email });
    if (existing) return existing;
    created.add(p.email);
    passwordHash ??= await bcrypt.hash(DEMO_PASSWORD, bcryptCost);
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
        failedSignIns: 0,
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
    for (const member of demo.members) {
      const user = await person(member, {});
      if (!(await memberships.existsBy({ organisationId: org.id, userId: user.id }))) {
        await memberships.insert({ organisationId: org.id, userId: user.id, role: member.role });
      }
    }
  }
  return report;
}
