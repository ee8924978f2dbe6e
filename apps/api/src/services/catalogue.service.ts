// Business rules for the platform catalogues: reading them, and the capability catalogue as
// network admins edit it.
import type { z } from 'zod';
import type { Capability, CapabilityCategory, CapabilityInputSchema, CapabilityPatchSchema, ServiceType } from '@emberline/domain';
import { CapabilityEntity, ServiceTypeEntity } from '../entities';
import type { ServiceContext } from '../lib/context';
import { createError, NotFound } from '../lib/errors';
import { audit } from './audit.service';

export const CapabilityExists = createError('CAPABILITY_EXISTS', 409, 'A capability with this code exists already');

function toCapability(e: CapabilityEntity): Capability {
  return { code: e.code, name: e.name, description: e.description, category: e.category, standards: e.standards, retired: e.retired };
}

function toServiceType(e: ServiceTypeEntity): ServiceType {
  return {
    code: e.code,
    name: e.name,
    summary: e.summary,
    description: e.description,
    defaultDurationMinutes: e.defaultDurationMinutes,
    requiredCapabilities: e.requiredCapabilities.map((c) => c.code).sort(),
    cautions: e.cautions,
    retired: e.retired,
  };
}

export async function listCapabilities(ctx: ServiceContext, filter: { category?: CapabilityCategory }): Promise<Capability[]> {
  const rows = await ctx.manager.getRepository(CapabilityEntity).find({
    where: { retired: false, ...(filter.category ? { category: filter.category } : {}) },
    order: { category: 'ASC', name: 'ASC' },
  });
  return rows.map(toCapability);
}

export async function listServiceTypes(ctx: ServiceContext): Promise<ServiceType[]> {
  const rows = await ctx.manager.getRepository(ServiceTypeEntity).find({
    where: { retired: false },
    relations: { requiredCapabilities: true },
    order: { sortOrder: 'ASC', code: 'ASC' },
  });
  return rows.map(toServiceType);
}

export async function getServiceType(ctx: ServiceContext, code: string): Promise<ServiceType> {
  const row = await ctx.manager.getRepository(ServiceTypeEntity).findOne({
    where: { code, retired: false },
    relations: { requiredCapabilities: true },
  });
  if (!row) throw NotFound(`There is no service type "${code}" in the catalogue.`);
  return toServiceType(row);
}

/** Network admins see the whole capability catalogue, retired entries included. */
export async function listAllCapabilities(ctx: ServiceContext): Promise<Capability[]> {
  const rows = await ctx.manager.getRepository(CapabilityEntity).find({ order: { retired: 'ASC', category: 'ASC', name: 'ASC' } });
  return rows.map(toCapability);
}

export async function createCapability(ctx: ServiceContext, input: z.output<typeof CapabilityInputSchema>): Promise<Capability> {
  const repo = ctx.manager.getRepository(CapabilityEntity);
  if (await repo.existsBy({ code: input.code })) throw CapabilityExists(`The code "${input.code}" is taken: codes are stable, so choose another one.`);
  await repo.insert({ ...input, retired: false });
  const saved = toCapability(await repo.findOneByOrFail({ code: input.code }));
  await audit(ctx, { action: 'capability.create', entityType: 'capability', entityId: saved.code, after: saved });
  return saved;
}

export async function updateCapability(ctx: ServiceContext, code: string, patch: z.output<typeof CapabilityPatchSchema>): Promise<Capability> {
  const repo = ctx.manager.getRepository(CapabilityEntity);
  const row = await repo.findOne({ where: { code }, lock: { mode: 'pessimistic_write' } });
  if (!row) throw NotFound(`There is no capability "${code}" in the catalogue.`);
  const before = toCapability(row);
  const changes = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined));
  if (Object.keys(changes).length) await repo.update({ id: row.id }, changes);
  const after = toCapability(await repo.findOneByOrFail({ id: row.id }));
  await audit(ctx, { action: after.retired !== before.retired ? (after.retired ? 'capability.retire' : 'capability.restore') : 'capability.update', entityType: 'capability', entityId: code, before, after });
  return after;
}
