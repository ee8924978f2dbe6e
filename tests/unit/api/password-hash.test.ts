// Password hashes: scrypt against RFC 7914's published vectors, the PHC string, bcrypt hashes from before.
import bcrypt from 'bcryptjs';
import { describe, expect, it } from 'vitest';
import { createGate, DEFAULT_PASSWORD_HASH_COST, hashPassword, needsRehash, scryptKey, verifyPassword } from '../../../apps/api/src/lib/password-hash';

const hex = (spaced: string) => Buffer.from(spaced.replace(/\s+/g, ''), 'hex');

describe('scrypt', () => {
  it('derives the test vectors of RFC 7914 §12', async () => {
    expect(await scryptKey('', Buffer.from(''), 64, { N: 16, r: 1, p: 1 })).toEqual(
      hex(`77 d6 57 62 38 65 7b 20 3b 19 ca 42 c1 8a 04 97 f1 6b 48 44 e3 07 4a e8 df df fa 3f ed e2 14 42
           fc d0 06 9d ed 09 48 f8 32 6a 75 3a 0f c8 1f 17 e8 d3 e0 fb 2e 0d 36 28 cf 35 e2 0c 38 d1 89 06`),
    );
    expect(await scryptKey('password', Buffer.from('NaCl'), 64, { N: 1024, r: 8, p: 16 })).toEqual(
      hex(`fd ba be 1c 9d 34 72 00 78 56 e7 19 0d 01 e9 fe 7c 6a d7 cb c8 23 78 30 e7 73 76 63 4b 37 31 62
           2e af 30 d9 2e 22 a3 88 6f f1 09 27 9d 98 30 da c7 27 af b9 4a 83 ee 6d 83 60 cb df a2 cc 06 40`),
    );
  });

  it("runs at OWASP's N = 2^17, r = 8 (128 MiB, above Node's default memory cap)", async () => {
    expect(DEFAULT_PASSWORD_HASH_COST).toBe(17);
    const stored = await hashPassword('a-long-password', DEFAULT_PASSWORD_HASH_COST);
    expect(stored).toMatch(/^\$scrypt\$ln=17,r=8,p=1\$[A-Za-z0-9+/]{22}\$[A-Za-z0-9+/]{43}$/);
    expect(stored.length).toBeLessThanOrEqual(100); // user_account.password_hash is VARCHAR(100)
    expect(await verifyPassword('a-long-password', stored)).toBe(true);
  }, 60_000);
});

describe('hashPassword and verifyPassword', () => {
  it('stores the parameters and a fresh salt with each hash, and verifies only the right password', async () => {
    const first = await hashPassword('correct horse battery', 4);
    const second = await hashPassword('correct horse battery', 4);
    expect(first).toMatch(/^\$scrypt\$ln=4,r=8,p=1\$/);
    expect(first).not.toBe(second);
    expect(await verifyPassword('correct horse battery', first)).toBe(true);
    expect(await verifyPassword('correct horse batterY', first)).toBe(false);
    expect(await verifyPassword('', first)).toBe(false);
  });

  it('verifies with the parameters stored in the hash, not the ones configured today', async () => {
    const older = await hashPassword('kept-from-before', 5);
    expect(await verifyPassword('kept-from-before', older)).toBe(true);
    expect(needsRehash(older, 4)).toBe(true);
  });

  it('still verifies bcrypt hashes made before the move', async () => {
    for (const stored of [await bcrypt.hash('legacy-password', 4), (await bcrypt.hash('legacy-password', 4)).replace(/^\$2b\$/, '$2a$')]) {
      expect(await verifyPassword('legacy-password', stored)).toBe(true);
      expect(await verifyPassword('legacy-passwore', stored)).toBe(false);
    }
  });

  it('answers false, without throwing, for what is no hash or a tampered one', async () => {
    const good = await hashPassword('something-long', 4);
    for (const stored of ['', 'bench-no-sign-in', '$2b$04$short', good.replace('ln=4', 'ln=30'), good.replace('r=8', 'r=64'), good.replace(/\$[^$]+$/, '$AAAA'), `${good.slice(0, -2)}xx`]) {
      expect(await verifyPassword('something-long', stored)).toBe(false);
    }
  });
});

describe('needsRehash', () => {
  it('asks to replace bcrypt hashes and scrypt hashes of another cost, not current ones', async () => {
    expect(needsRehash(await bcrypt.hash('x-password', 4), 4)).toBe(true);
    expect(needsRehash(await hashPassword('x-password', 4), 4)).toBe(false);
    expect(needsRehash(await hashPassword('x-password', 4), 5)).toBe(true);
    expect(needsRehash('not a hash', 4)).toBe(true);
  });
});

describe('createGate', () => {
  it('runs at most `slots` tasks at once, in order, and frees a slot when a task fails', async () => {
    const gate = createGate(2);
    let inFlight = 0;
    let most = 0;
    const started: number[] = [];
    const task = (i: number) => gate(async () => {
      started.push(i);
      most = Math.max(most, ++inFlight);
      await new Promise((r) => setTimeout(r, 5));
      inFlight--;
      if (i === 1) throw new Error('boom');
      return i;
    });
    const results = await Promise.allSettled([0, 1, 2, 3, 4, 5].map(task));
    expect(most).toBe(2);
    expect(started).toEqual([0, 1, 2, 3, 4, 5]);
    expect(results.map((r) => r.status)).toEqual(['fulfilled', 'rejected', 'fulfilled', 'fulfilled', 'fulfilled', 'fulfilled']);
  });
});
