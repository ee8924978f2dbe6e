// Configuration parsing: defaults, coercion, and errors that name the variable.
import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../../apps/api/src/config';

const base = { DB_PASSWORD: 'secret-for-tests' };

describe('loadConfig', () => {
  it('fills documented defaults', () => {
    const c = loadConfig(base);
    expect(c).toMatchObject({ HOST: '127.0.0.1', PORT: 4000, DB_PORT: 3307, DB_NAME: 'emberline', SERVE_APPS: true, TRUST_PROXY: false });
    expect(c.publicUrl).toBe('http://127.0.0.1:4000');
    expect(Object.isFrozen(c)).toBe(true);
  });

  it('coerces numbers and flags from strings', () => {
    const c = loadConfig({ ...base, PORT: '8080', SERVE_APPS: 'false' });
    expect(c.PORT).toBe(8080);
    expect(c.SERVE_APPS).toBe(false);
  });

  it.each([
    [{ PORT: 'eighty' }, 'PORT'],
    [{ PORT: '70000' }, 'PORT'],
    [{ DB_PORT: '0' }, 'DB_PORT'],
    [{ LOG_LEVEL: 'loud' }, 'LOG_LEVEL'],
    [{ DB_NAME: 'drop table;' }, 'DB_NAME'],
    [{ PUBLIC_URL: 'not a url' }, 'PUBLIC_URL'],
    [{ SERVE_APPS: 'maybe' }, 'SERVE_APPS'],
  ])('rejects %o naming %s', (env, variable) => {
    let error: unknown;
    try {
      loadConfig({ ...base, ...env });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ConfigError);
    expect((error as ConfigError).issues.map((i) => i.variable)).toEqual([variable]);
    expect((error as ConfigError).message).toContain(variable);
  });

  it('requires DB_PASSWORD', () => {
    expect(() => loadConfig({})).toThrow(/DB_PASSWORD/);
  });
});

/** Who Express says the client is, behind the given TRUST_PROXY, for a request forwarded by `forwardedFor`. */
async function clientSeen(trust: string, forwardedFor: string): Promise<string> {
  const app = express();
  app.set('trust proxy', loadConfig({ ...base, TRUST_PROXY: trust }).TRUST_PROXY);
  app.get('/', (req, res) => {
    res.json({ ip: req.ip });
  });
  return (await request(app).get('/').set('x-forwarded-for', forwardedFor)).body.ip as string;
}

describe('TRUST_PROXY', () => {
  it('takes a hop count, false, or addresses and subnets', () => {
    expect(loadConfig({ ...base, TRUST_PROXY: '1' }).TRUST_PROXY).toBe(1);
    expect(loadConfig({ ...base, TRUST_PROXY: '2' }).TRUST_PROXY).toBe(2);
    expect(loadConfig({ ...base, TRUST_PROXY: '0' }).TRUST_PROXY).toBe(false);
    expect(loadConfig({ ...base, TRUST_PROXY: 'false' }).TRUST_PROXY).toBe(false);
    expect(loadConfig({ ...base, TRUST_PROXY: ' 10.0.0.0/8, loopback,192.168.1.7, fd00::/8,172.16.0.0/255.240.0.0 ' }).TRUST_PROXY).toEqual([
      '10.0.0.0/8',
      'loopback',
      '192.168.1.7',
      'fd00::/8',
      '172.16.0.0/255.240.0.0',
    ]);
  });

  it('refuses true (every hop trusted) with a message that says what to give instead', () => {
    let error: unknown;
    try {
      loadConfig({ ...base, TRUST_PROXY: 'true' });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ConfigError);
    expect((error as ConfigError).issues).toEqual([{ variable: 'TRUST_PROXY', message: expect.stringMatching(/every hop.*number of proxies/) }]);
  });

  it.each(['yes', '1.5', '-1', '17', '10.0.0.0/33', '300.1.1.1', '10.0.0.1,', 'loopback,proxy.example', 'fd00::/129', '10.0.0.0/8/8'])('refuses %j', (value) => {
    expect(() => loadConfig({ ...base, TRUST_PROXY: value })).toThrow(/TRUST_PROXY/);
  });

  it('lets a client choose its own address only through hops that are trusted', async () => {
    // the load balancer appends the address it saw; what the client wrote comes before it
    const forwarded = '203.0.113.66, 198.51.100.7';
    expect(await clientSeen('false', forwarded)).toMatch(/127\.0\.0\.1$/);
    expect(await clientSeen('1', forwarded)).toBe('198.51.100.7');
    expect(await clientSeen('loopback', forwarded)).toBe('198.51.100.7');
    expect(await clientSeen('2', forwarded)).toBe('203.0.113.66');
  });
});
