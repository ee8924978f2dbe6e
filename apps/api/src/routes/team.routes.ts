// Organisation-scoped team routes under /orgs/:orgId.
import { z } from 'zod';
import { ChangeRoleSchema, IdSchema, InvitationSchema, InviteSchema, OrganisationSummarySchema, TeamSchema } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { teamController } from '../controllers/team.controller';

const OrgParams = z.object({ orgId: IdSchema });
export function registerTeamRoutes(api: ApiRouter, app: AppContext): void {
  const c = teamController(app);
  const tags = ['Team'];
  api.route(
    { method: 'get', path: '/orgs/:orgId', summary: 'The organisation the caller belongs to', tags, org: true, params: OrgParams, response: z.object({ data: OrganisationSummarySchema }) },
    c.getOrganisation,
  );
  api.route(
    { method: 'get', path: '/orgs/:orgId/team', summary: 'Members and pending invitations', tags, org: true, params: OrgParams, response: z.object({ data: TeamSchema }) },
    c.getTeam,
  );
  api.route(
    {
      method: 'post',
      path: '/orgs/:orgId/invitations',
      summary: 'Invite a technician or another admin by e-mail',
      tags,
      org: true,
      roles: ['partner_admin'],
      params: OrgParams,
      body: InviteSchema,
      response: z.object({ data: InvitationSchema }),
      status: 201,
      before: app.limiters.invitation,
      problems: [409],
    },
    c.invite,
  );
  api.route(
    {
      method: 'delete',
      path: '/orgs/:orgId/invitations/:invitationId',
      summary: 'Withdraw a pending invitation',
      tags,
      org: true,
      roles: ['partner_admin'],
      params: OrgParams.extend({ invitationId: IdSchema }),
      response: z.object({ data: z.object({ revoked: z.literal(true) }) }),
    },
    c.revokeInvitation,
  );
  api.route(
    {
      method: 'patch',
      path: '/orgs/:orgId/members/:userId',
      summary: "Change a member's role",
      tags,
      org: true,
      roles: ['partner_admin'],
      params: OrgParams.extend({ userId: IdSchema }),
      body: ChangeRoleSchema,
      response: z.object({ data: TeamSchema }),
      problems: [409],
    },
    c.changeRole,
  );
  api.route(
    {
      method: 'delete',
      path: '/orgs/:orgId/members/:userId',
      summary: 'Remove a member from the organisation',
      tags,
      org: true,
      roles: ['partner_admin'],
      params: OrgParams.extend({ userId: IdSchema }),
      response: z.object({ data: TeamSchema }),
      problems: [409],
    },
    c.removeMember,
  );
}
