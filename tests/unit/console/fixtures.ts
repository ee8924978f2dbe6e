// Shared test data for Console component tests: sessions for each kind of user, a team.
import { ApiError } from '@emberline/api-client';
import type { Me, MemberRole, Session, Team } from '@emberline/domain';

export const ORG_A = '2d3cc6cb-138b-49be-b56a-165fa7e28724';
export const ORG_B = '7f1c2a90-5b7e-4c1d-9a3e-0d6b8c4e2f11';

export function me(overrides: Partial<Me> = {}): Me {
  return {
    id: '939bd5f8-c1a7-4b68-8087-035df3220c08',
    email: 'mara@partner.example',
    name: 'Mara Kessel',
    locale: 'en',
    emailVerified: true,
    roles: [],
    memberships: [],
    ...overrides,
  };
}

export function member(role: MemberRole, organisationId = ORG_A, organisationName = 'Ember Vans North'): Me['memberships'][number] {
  return { organisationId, organisationName, organisationStatus: 'approved', role };
}

export function session(user: Me, accessToken = 'access-1'): Session {
  return { accessToken, expiresIn: 900, user };
}

export function problem(status: number, code: string, detail?: string, errors?: { path: string; message: string }[]): ApiError {
  return new ApiError({ type: 'about:blank', title: code, status, code, detail, errors });
}

export const signedOut = () => problem(401, 'SESSION_EXPIRED', 'Your session has ended.');

export const team: Team = {
  members: [
    { userId: '939bd5f8-c1a7-4b68-8087-035df3220c08', name: 'Mara Kessel', email: 'mara@partner.example', role: 'partner_admin', joinedAt: '2026-01-12T09:00:00.000Z' },
    { userId: '4b2f0a1e-6c3d-4e8f-9a7b-1c2d3e4f5a6b', name: 'Jonas Brandt', email: 'jonas@partner.example', role: 'technician', joinedAt: '2026-02-03T09:00:00.000Z' },
  ],
  invitations: [
    {
      id: 'a1b2c3d4-e5f6-4a7b-8c9d-0e1f2a3b4c5d',
      email: 'new.tech@partner.example',
      role: 'technician',
      invitedBy: 'Mara Kessel',
      createdAt: '2026-03-01T10:00:00.000Z',
      expiresAt: '2026-03-08T10:00:00.000Z',
    },
  ],
};
