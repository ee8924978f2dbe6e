// An owner's garage. Every query is scoped to the signed-in owner; another owner's vehicle is
// simply not found.
import type { Vehicle, VehicleInput } from '@emberline/domain';
import { MAX_VEHICLES } from '@emberline/domain';
import { VehicleEntity } from '../entities';
import type { ServiceContext } from '../lib/context';
import { createError, NotFound } from '../lib/errors';
import { newId } from '../lib/secure-token';

export const GarageFull = createError('GARAGE_FULL', 409, 'Your garage is full');

function owner(ctx: ServiceContext): string {
  if (!ctx.actor.userId) throw new Error('vehicle service called without a signed-in owner');
  return ctx.actor.userId;
}

function toVehicle(v: VehicleEntity): Vehicle {
  return {
    id: v.id,
    name: v.name,
    model: v.model,
    year: v.year,
    fuel: v.fuel,
    factoryHeater: v.factoryHeater,
    climateControl: v.climateControl,
    electricalSystemV: Number(v.electricalSystemV) as 12 | 24,
    batteryCapacityAh: v.batteryCapacityAh,
    batteryType: v.batteryType,
    createdAt: v.createdAt.toISOString(),
    updatedAt: v.updatedAt.toISOString(),
  };
}

async function find(ctx: ServiceContext, id: string): Promise<VehicleEntity> {
  const v = await ctx.manager.getRepository(VehicleEntity).findOneBy({ id, ownerUserId: owner(ctx) });
  if (!v) throw NotFound('There is no such vehicle in your garage.');
  return v;
}

export async function listVehicles(ctx: ServiceContext): Promise<Vehicle[]> {
  const rows = await ctx.manager.getRepository(VehicleEntity).find({ where: { ownerUserId: owner(ctx) }, order: { createdAt: 'ASC' } });
  return rows.map(toVehicle);
}

export async function addVehicle(ctx: ServiceContext, input: VehicleInput): Promise<Vehicle> {
  const repo = ctx.manager.getRepository(VehicleEntity);
  if ((await repo.countBy({ ownerUserId: owner(ctx) })) >= MAX_VEHICLES) throw GarageFull(`A garage holds up to ${MAX_VEHICLES} vehicles.`);
  const id = newId();
  await repo.insert({ id, ownerUserId: owner(ctx), ...input });
  return toVehicle(await repo.findOneByOrFail({ id }));
}

export async function updateVehicle(ctx: ServiceContext, id: string, changes: Partial<VehicleInput>): Promise<Vehicle> {
  const v = await find(ctx, id);
  const patch = Object.fromEntries(Object.entries(changes).filter(([, value]) => value !== undefined));
  if (Object.keys(patch).length) await ctx.manager.getRepository(VehicleEntity).update({ id: v.id }, patch);
  return toVehicle(await ctx.manager.getRepository(VehicleEntity).findOneByOrFail({ id: v.id }));
}

export async function removeVehicle(ctx: ServiceContext, id: string): Promise<void> {
  const v = await find(ctx, id);
  await ctx.manager.getRepository(VehicleEntity).delete({ id: v.id });
}
