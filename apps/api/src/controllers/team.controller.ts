// Team handlers for /orgs/:orgId: the caller's organisation was resolved by the org guard.
import type { EntityManager } from 'typeorm';
import type { Invite, MemberRole } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { Actor } from '../lib/context';
import * as team from '../services/team.service';

export function teamController({ dataSource, authSettings }: AppContext) {
  const tx = <T>(actor: Actor, fn: (ctx: { manager: EntityManager; actor: Actor }) => Promise<T>) => dataSource.transaction((manager) => fn({ manager, actor }));
  const read = (actor: Actor) => ({ manager: dataSource.manager, actor });
  return {
    getOrganisation: async ({ actor }: { actor: Actor }) => ({ data: await team.getOrganisationSummary(read(actor)) }),
    getTeam: async ({ actor }: { actor: Actor }) => ({ data: await team.getTeam(read(actor)) }),
    invite: async ({ body, actor }: { body: Invite & { email: string }; actor: Actor }) => ({
      data: await tx(actor, (ctx) => team.invite(ctx, body, authSettings)),
    }),
    revokeInvitation: async ({ params, actor }: { params: { invitationId: string }; actor: Actor }) => {
      await tx(actor, (ctx) => team.revokeInvitation(ctx, params.invitationId));
      return { data: { revoked: true as const } };
    },
    changeRole: async ({ params, body, actor }: { params: { userId: string }; body: { role: MemberRole }; actor: Actor }) => {
      await tx(actor, (ctx) => team.changeRole(ctx, params.userId, body.role));
      return { data: await team.getTeam(read(actor)) };
    },
    removeMember: async ({ params, actor }: { params: { userId: string }; actor: Actor }) => {
      await tx(actor, (ctx) => team.removeMember(ctx, params.userId));
      return { data: await team.getTeam(read(actor)) };
    },
  };
}
