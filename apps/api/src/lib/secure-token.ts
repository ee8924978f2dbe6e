// Random tokens for links and cookies; the database keeps only their SHA-256 hashes, so a
// leaked table cannot be turned into working links.
import { createHash, randomBytes, randomUUID } from 'node:crypto';

export const newId = (): string => randomUUID();

export function newToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: hashToken(token) };
}

export const hashToken = (token: string): string => createHash('sha256').update(token, 'utf8').digest('hex');
