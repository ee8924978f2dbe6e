// Accounts: sign-up, sign-in, sessions, e-mail links, the signed-in user, teams and the admin logs.
import { z } from 'zod';
import {
  AcceptedSchema,
  AuditEntrySchema,
  InvitationPreviewSchema,
  InvitationSchema,
  MailLogEntrySchema,
  MeResponseSchema,
  OrganisationSummarySchema,
  SessionResponseSchema,
  TeamSchema,
  type AcceptInvitation,
  type AuditEntry,
  type Invitation,
  type InvitationPreview,
  type Invite,
  type MailLogEntry,
  type Me,
  type MemberRole,
  type OrganisationSummary,
  type OwnerSignUp,
  type PartnerSignUp,
  type ResetPassword,
  type Session,
  type SignIn,
  type Team,
} from '@emberline/domain';
import type { HttpClient } from './http';

/** Which app an e-mail link should open. */
export type LinkApp = 'directory' | 'console';
export type Accepted = z.infer<typeof AcceptedSchema>['data'];

const InvitationPreviewResponseSchema = z.object({ data: InvitationPreviewSchema });
const OrganisationResponseSchema = z.object({ data: OrganisationSummarySchema });
const TeamResponseSchema = z.object({ data: TeamSchema });
const InvitationResponseSchema = z.object({ data: InvitationSchema });
const RevokedResponseSchema = z.object({ data: z.object({ revoked: z.literal(true) }) });
const MailLogResponseSchema = z.object({ data: z.array(MailLogEntrySchema) });
const AuditLogResponseSchema = z.object({ data: z.array(AuditEntrySchema) });

const seg = encodeURIComponent;

export async function signUpOwner(http: HttpClient, body: OwnerSignUp): Promise<Accepted> {
  return (await http.request('POST', '/api/auth/sign-up', { body, schema: AcceptedSchema })).data;
}

export async function signUpPartner(http: HttpClient, body: PartnerSignUp): Promise<Accepted> {
  return (await http.request('POST', '/api/auth/partner-sign-up', { body, schema: AcceptedSchema })).data;
}

export async function resendVerification(http: HttpClient, body: { email: string; app: LinkApp }): Promise<Accepted> {
  return (await http.request('POST', '/api/auth/resend-verification', { body, schema: AcceptedSchema })).data;
}

export async function signIn(http: HttpClient, body: SignIn): Promise<Session> {
  return (await http.request('POST', '/api/auth/sign-in', { body, schema: SessionResponseSchema })).data;
}

/** Swaps the refresh cookie for a new session. Callers must never run two at once (reuse revokes the family). */
export async function refreshSession(http: HttpClient): Promise<Session> {
  return (await http.request('POST', '/api/auth/refresh', { schema: SessionResponseSchema })).data;
}

export async function signOut(http: HttpClient): Promise<Accepted> {
  return (await http.request('POST', '/api/auth/sign-out', { schema: AcceptedSchema })).data;
}

export async function verifyEmail(http: HttpClient, token: string): Promise<Session> {
  return (await http.request('POST', '/api/auth/verify-email', { body: { token }, schema: SessionResponseSchema })).data;
}

export async function forgotPassword(http: HttpClient, body: { email: string; app: LinkApp }): Promise<Accepted> {
  return (await http.request('POST', '/api/auth/forgot-password', { body, schema: AcceptedSchema })).data;
}

export async function resetPassword(http: HttpClient, body: ResetPassword): Promise<Accepted> {
  return (await http.request('POST', '/api/auth/reset-password', { body, schema: AcceptedSchema })).data;
}

export async function previewInvitation(http: HttpClient, token: string, signal?: AbortSignal): Promise<InvitationPreview> {
  return (await http.request('GET', `/api/auth/invitations/${seg(token)}`, { schema: InvitationPreviewResponseSchema, signal })).data;
}

export async function acceptInvitation(http: HttpClient, body: AcceptInvitation): Promise<Session> {
  return (await http.request('POST', '/api/auth/invitations/accept', { body, schema: SessionResponseSchema })).data;
}

export async function getMe(http: HttpClient, signal?: AbortSignal): Promise<Me> {
  return (await http.request('GET', '/api/me', { schema: MeResponseSchema, signal })).data;
}

export async function updateMe(http: HttpClient, body: { name?: string; locale?: 'en' | 'de' }): Promise<Me> {
  return (await http.request('PATCH', '/api/me', { body, schema: MeResponseSchema })).data;
}

export async function getOrganisation(http: HttpClient, orgId: string, signal?: AbortSignal): Promise<OrganisationSummary> {
  return (await http.request('GET', `/api/orgs/${seg(orgId)}`, { schema: OrganisationResponseSchema, signal })).data;
}

export async function getTeam(http: HttpClient, orgId: string, signal?: AbortSignal): Promise<Team> {
  return (await http.request('GET', `/api/orgs/${seg(orgId)}/team`, { schema: TeamResponseSchema, signal })).data;
}

export async function inviteMember(http: HttpClient, orgId: string, body: Invite): Promise<Invitation> {
  return (await http.request('POST', `/api/orgs/${seg(orgId)}/invitations`, { body, schema: InvitationResponseSchema })).data;
}

export async function revokeInvitation(http: HttpClient, orgId: string, invitationId: string): Promise<void> {
  await http.request('DELETE', `/api/orgs/${seg(orgId)}/invitations/${seg(invitationId)}`, { schema: RevokedResponseSchema });
}

export async function changeMemberRole(http: HttpClient, orgId: string, userId: string, role: MemberRole): Promise<Team> {
  return (await http.request('PATCH', `/api/orgs/${seg(orgId)}/members/${seg(userId)}`, { body: { role }, schema: TeamResponseSchema })).data;
}

export async function removeMember(http: HttpClient, orgId: string, userId: string): Promise<Team> {
  return (await http.request('DELETE', `/api/orgs/${seg(orgId)}/members/${seg(userId)}`, { schema: TeamResponseSchema })).data;
}

export interface MailLogQuery {
  status?: MailLogEntry['status'];
  to?: string;
  limit?: number;
}

export async function listMailLog(http: HttpClient, query: MailLogQuery = {}, signal?: AbortSignal): Promise<MailLogEntry[]> {
  return (await http.request('GET', '/api/admin/mail-log', { query: { ...query }, schema: MailLogResponseSchema, signal })).data;
}

export async function listAuditLog(http: HttpClient, query: { organisationId?: string; limit?: number } = {}, signal?: AbortSignal): Promise<AuditEntry[]> {
  return (await http.request('GET', '/api/admin/audit-log', { query: { ...query }, schema: AuditLogResponseSchema, signal })).data;
}
