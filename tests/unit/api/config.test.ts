// Configuration parsing: defaults, coercion, and errors that name the variable.
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
    const c = loadConfig({ ...base, PORT: '8080', SERVE_APPS: 'false', TRUST_PROXY: '1' });
    expect(c.PORT).toBe(8080);
    expect(c.SERVE_APPS).toBe(false);
    expect(c.TRUST_PROXY).toBe(true);
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
