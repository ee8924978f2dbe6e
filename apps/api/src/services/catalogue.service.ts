// Business rules for reading the platform catalogues.
import type { Capability, CapabilityCategory, ServiceType } from '@emberline/domain';
import { CapabilityEntity, ServiceTypeEntity } from '../entities';
import type { ServiceContext } from '../lib/context';
import { NotFound } from '../lib/errors';

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
