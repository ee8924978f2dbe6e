// Sessions: short-lived access JWTs plus rotating refresh tokens kept hashed in MariaDB.
// Each sign-in starts a token family; presenting a used or revoked refresh token revokes the
// whole family, because it means the token was copied.
import jwt from 'jsonwebtoken';
import { IsNull, type EntityManager } from 'typeorm';
import type { Me, Role, Session } from '@emberline/domain';
import { MembershipEntity, RefreshTokenEntity, UserAccountEntity } from '../entities';
import { createError, type HttpError } from '../lib/errors';
import { hashToken, newId, newToken } from '../lib/secure-token';

export const JWT_ISSUER = 'emberline';
export const JWT_AUDIENCE = 'emberline-api';

export interface SessionSettings {
  jwtSecret: string;
  accessTtlSeconds: number;
  refreshTtlDays: number;
}

export const SessionExpired = createError('SESSION_EXPIRED', 401, 'Your session has ended: please sign in again');

export interface IssuedSession extends Session {
  refreshToken: string;
  refreshExpiresAt: Date;
}

export function platformRoles(user: UserAccountEntity): Role[] {
  const roles: Role[] = [];
  if (user.isOwner) roles.push('owner');
  if (user.isNetworkAdmin) roles.push('network_admin');
  return roles;
}

export async function describeUser(manager: EntityManager, user: UserAccountEntity): Promise<Me> {
  const memberships = await manager.getRepository(MembershipEntity).find({
    where: { userId: user.id },
    relations: { organisation: true },
    order: { createdAt: 'ASC' },
  });
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    locale: user.locale,
    emailVerified: user.emailVerifiedAt !== null,
    roles: platformRoles(user),
    memberships: memberships.map((m) => ({
      organisationId: m.organisationId,
      organisationName: m.organisation.name,
      organisationStatus: m.organisation.status,
      role: m.role,
    })),
  };
}

/** `tokenVersion` is the account's at signing; the guard refuses the token once the account's is higher. */
export function signAccessToken(userId: string, settings: SessionSettings, tokenVersion = 0): string {
  return jwt.sign({ typ: 'access', ver: tokenVersion }, settings.jwtSecret, {
    algorithm: 'HS256',
    subject: userId,
    issuer: JWT_ISSUER,
    audience: JWT_AUDIENCE,
    expiresIn: settings.accessTtlSeconds,
  });
}

async function storeRefreshToken(manager: EntityManager, userId: string, familyId: string, settings: SessionSettings) {
  const { token, hash } = newToken();
  const expiresAt = new Date(Date.now() + settings.refreshTtlDays * 86_400_000);
  await manager.getRepository(RefreshTokenEntity).insert({ id: newId(), userId, familyId, tokenHash: hash, expiresAt, usedAt: null, revokedAt: null });
  return { token, expiresAt };
}

export async function issueSession(manager: EntityManager, user: UserAccountEntity, settings: SessionSettings, familyId = newId()): Promise<IssuedSession> {
  const refresh = await storeRefreshToken(manager, user.id, familyId, settings);
  return {
    accessToken: signAccessToken(user.id, settings, user.tokenVersion ?? 0),
    expiresIn: settings.accessTtlSeconds,
    user: await describeUser(manager, user),
    refreshToken: refresh.token,
    refreshExpiresAt: refresh.expiresAt,
  };
}

export async function revokeFamily(manager: EntityManager, familyId: string): Promise<void> {
  await manager.getRepository(RefreshTokenEntity).update({ familyId, revokedAt: IsNull() }, { revokedAt: new Date() });
}

/**
 * Swaps a refresh token for a new one of the same family, inside the caller's transaction.
 * A used or revoked token is a copy: the caller must revoke `reusedFamily` outside the
 * transaction (which it rolls back) and refuse.
 */
export async function rotateRefreshToken(
  manager: EntityManager,
  presented: string | undefined,
  settings: SessionSettings,
): Promise<{ session: IssuedSession } | { error: HttpError; reusedFamily?: string }> {
  if (!presented) return { error: SessionExpired('There is no session to continue.') };
  const repo = manager.getRepository(RefreshTokenEntity);
  const row = await repo.findOne({ where: { tokenHash: hashToken(presented) }, lock: { mode: 'pessimistic_write' } });
  if (!row) return { error: SessionExpired('This session is not known.') };
  if (row.usedAt || row.revokedAt) {
    return { error: SessionExpired('This session was used elsewhere and has been closed for your safety.'), reusedFamily: row.familyId };
  }
  if (row.expiresAt.getTime() <= Date.now()) return { error: SessionExpired('This session has expired.') };
  await repo.update({ id: row.id }, { usedAt: new Date() });
  const user = await manager.getRepository(UserAccountEntity).findOneByOrFail({ id: row.userId });
  return { session: await issueSession(manager, user, settings, row.familyId) };
}

export async function revokeRefreshToken(manager: EntityManager, presented: string | undefined): Promise<void> {
  if (!presented) return;
  const row = await manager.getRepository(RefreshTokenEntity).findOneBy({ tokenHash: hashToken(presented) });
  if (row) await revokeFamily(manager, row.familyId);
}

export async function revokeAllSessions(manager: EntityManager, userId: string): Promise<void> {
  await manager.getRepository(RefreshTokenEntity).update({ userId, revokedAt: IsNull() }, { revokedAt: new Date() });
}
