// One partner organisation: its summary, members and pending invitations.
import * as client from '@emberline/api-client';
import type { Invitation, Invite, MemberRole, OrganisationSummary, Team } from '@emberline/domain';
import { http } from './http';

export function getOrganisation(orgId: string, signal?: AbortSignal): Promise<OrganisationSummary> {
  return client.getOrganisation(http, orgId, signal);
}

export function getTeam(orgId: string, signal?: AbortSignal): Promise<Team> {
  return client.getTeam(http, orgId, signal);
}

export function inviteMember(orgId: string, body: Invite): Promise<Invitation> {
  return client.inviteMember(http, orgId, body);
}

export function revokeInvitation(orgId: string, invitationId: string): Promise<void> {
  return client.revokeInvitation(http, orgId, invitationId);
}

export function changeMemberRole(orgId: string, userId: string, role: MemberRole): Promise<Team> {
  return client.changeMemberRole(http, orgId, userId, role);
}

export function removeMember(orgId: string, userId: string): Promise<Team> {
  return client.removeMember(http, orgId, userId);
}
