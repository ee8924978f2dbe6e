// Secrets for development generated once into the git-ignored var/ folder, never committed.
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { projectRoot } from '../config';

export function localSecret(name: string, bytes = 18): string {
  const dir = path.join(projectRoot, 'var');
  mkdirSync(dir, { recursive: true });
  const file = path.join(dir, 'secrets.json');
  const secrets: Record<string, string> = existsSync(file) ? JSON.parse(readFileSync(file, 'utf8')) : {};
  if (!secrets[name]) {
    secrets[name] = randomBytes(bytes).toString('base64url');
    writeFileSync(file, JSON.stringify(secrets, null, 2) + '\n', { mode: 0o600 });
  }
  return secrets[name]!;
}
