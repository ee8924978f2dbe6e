// The signed-in user's own account.
import type { Me } from '@emberline/domain';
import { UserAccountEntity } from '../entities';
import type { ServiceContext } from '../lib/context';
import { describeUser } from './session.service';

export async function getMe(ctx: ServiceContext): Promise<Me> {
  const user = await ctx.manager.getRepository(UserAccountEntity).findOneByOrFail({ id: ctx.actor.userId! });
  return describeUser(ctx.manager, user);
}

export async function updateMe(ctx: ServiceContext, changes: { name?: string; locale?: 'en' | 'de' }): Promise<Me> {
  const patch = Object.fromEntries(Object.entries(changes).filter(([, v]) => v !== undefined));
  if (Object.keys(patch).length) await ctx.manager.getRepository(UserAccountEntity).update({ id: ctx.actor.userId! }, patch);
  return getMe(ctx);
}
