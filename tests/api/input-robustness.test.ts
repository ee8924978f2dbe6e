// Input that once answered 500: malformed encodings, impossible dates, lone surrogates, missing
// assets, lenient numbers and bodies of the wrong type must each be a 4xx problem details.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/app';
import { partnerWithTeam, signIn, type SignedIn } from '../setup/accounts';
import { BUSINESS, bearer, upload } from '../setup/onboarding';
import { isoDay, pdfBytes } from '../setup/files';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';

let t: TestApp;
let owner: SignedIn;
let partner: Awaited<ReturnType<typeof partnerWithTeam>>;

function expectProblem(res: request.Response, status: number) {
  expect(res.status, res.text).toBe(status);
  expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  expect(res.body.status).toBe(status);
  expect(res.text).not.toMatch(/\n\s+at /);
}

const SEARCH = '/api/search?serviceType=handset-pairing';
const fieldPaths = (res: request.Response) => (res.body.errors ?? []).map((e: { path: string }) => e.path);

beforeAll(async () => {
  t = await createTestApp();
  owner = await signIn(t.app, 'clara@owners.example', DEMO_PASSWORD);
  partner = await partnerWithTeam(t.app, t.dataSource);
}, 60_000);
afterAll(() => t.close());

describe('malformed percent-encoding in a path parameter', () => {
  it('answers 400 problem details, not 500', async () => {
    const res = await request(t.app).get('/api/orgs/%E0%A4%A/bookings').set(bearer(owner));
    expectProblem(res, 400);
    expect(res.body.code).toBe('MALFORMED_URL');
  });

  it('answers 400 for a public route too', async () => {
    expectProblem(await request(t.app).get('/api/partners/%ZZ'), 400);
  });
});

describe('dates that match YYYY-MM-DD but do not exist', () => {
  it('refuses 2031-02-31 as a document expiry with a field error', async () => {
    const res = await upload(t.app, partner.admin, partner.orgId, { kind: 'insurance', expiresOn: '2031-02-31' }, { bytes: pdfBytes('Insurance'), name: 'insurance.pdf' });
    expectProblem(res, 400);
    expect(fieldPaths(res)).toContain('expiresOn');
  });

  it('still takes a real future date', async () => {
    const res = await upload(t.app, partner.admin, partner.orgId, { kind: 'insurance', expiresOn: isoDay(300) }, { bytes: pdfBytes('Insurance'), name: 'insurance.pdf' });
    expect(res.status, res.text).toBe(201);
  });
});

describe('lone UTF-16 surrogates in text', () => {
  it('refuses them in a JSON body with a field error naming the field', async () => {
    const res = await request(t.app).patch('/api/me').set(bearer(owner)).set('content-type', 'application/json').send('{"name":"Clara \\ud800 Innerhofer"}');
    expectProblem(res, 400);
    expect(fieldPaths(res)).toEqual(['name']);
  });

  it('refuses them in nested bodies and in object keys', async () => {
    const res = await request(t.app)
      .put(`/api/orgs/${partner.orgId}/application/capabilities`)
      .set(bearer(partner.admin))
      .set('content-type', 'application/json')
      .send('{"capabilities":[{"code":"vci-pass-thru","notes":"\\udfff"}],"\\ud83d":1}');
    expectProblem(res, 400);
    expect(fieldPaths(res)).toEqual(expect.arrayContaining(['capabilities.0.notes']));
  });

  it('refuses them in a step the audit log records, leaving nothing written', async () => {
    const body = JSON.stringify({ ...BUSINESS, legalName: 'Glimmspur \ud800 e.U.' });
    // JSON.stringify writes the lone surrogate as the escape \ud800, as a client would send it
    expect(body).toContain('\\ud800');
    const before = await t.dataSource.query('SELECT COUNT(*) AS n FROM audit_log WHERE organisation_id = ?', [partner.orgId]);
    const res = await request(t.app).put(`/api/orgs/${partner.orgId}/application/business`).set(bearer(partner.admin)).set('content-type', 'application/json').send(body);
    expectProblem(res, 400);
    expect(fieldPaths(res)).toEqual(['legalName']);
    expect(await t.dataSource.query('SELECT COUNT(*) AS n FROM audit_log WHERE organisation_id = ?', [partner.orgId])).toEqual(before);
  });

  it('checks a deeply nested body quickly (the check walks it without copying paths)', async () => {
    const depth = 200_000;
    const started = Date.now();
    const res = await request(t.app).patch('/api/me').set(bearer(owner)).set('content-type', 'application/json').send(`{"name":"x","deep":${'['.repeat(depth)}"\\ud800"${']'.repeat(depth)}}`);
    expectProblem(res, 400);
    expect(Date.now() - started).toBeLessThan(5_000);
  });

  it('takes a well-formed pair (an emoji) as before', async () => {
    const res = await request(t.app).patch('/api/me').set(bearer(owner)).send({ name: 'Clara Innerhofer \u{1F525}' });
    expect(res.status, res.text).toBe(200);
    await request(t.app).patch('/api/me').set(bearer(owner)).send({ name: 'Clara Innerhofer' }).expect(200);
  });
});

describe('numbers in the query string', () => {
  it.each([
    ['empty', ''],
    ['whitespace', '%20%20'],
    ['hexadecimal', '0x10'],
    ['binary', '0b1'],
    ['exponent only', 'e5'],
    ['Infinity', 'Infinity'],
  ])('refuses a %s limit with a field error', async (_what, value) => {
    const res = await request(t.app).get(`${SEARCH}&lat=47.27&lng=11.40&limit=${value}`);
    expectProblem(res, 400);
    expect(fieldPaths(res)).toContain('query.limit');
  });

  it('refuses an empty latitude instead of reading it as 0', async () => {
    const res = await request(t.app).get(`${SEARCH}&lat=&lng=11.40`);
    expectProblem(res, 400);
    expect(fieldPaths(res)).toContain('query.lat');
  });

  it('still reads decimal numbers, with a sign, a fraction or an exponent', async () => {
    const ok = await request(t.app).get(`${SEARCH}&lat=%2B47.27&lng=1.14e1&limit=16`);
    expect(ok.status, ok.text).toBe(200);
    expect(ok.body.data.length).toBeLessThanOrEqual(16);
  });

  it('refuses blank numbers in the vehicle profile and in admin lists too', async () => {
    const res = await request(t.app).get(`${SEARCH}&lat=47.27&lng=11.40&year=&electricalSystemV=0x0c`);
    expectProblem(res, 400);
    expect(fieldPaths(res).sort()).toEqual(['query.electricalSystemV', 'query.year']);
  });
});

describe('a body that is not JSON on a JSON route', () => {
  it('answers 415 for JSON sent as text/plain', async () => {
    const res = await request(t.app).patch('/api/me').set(bearer(owner)).set('content-type', 'text/plain').send('{"name":"Plain Text"}');
    expectProblem(res, 415);
    expect(res.body.code).toBe('UNSUPPORTED_MEDIA_TYPE');
    const me = await request(t.app).get('/api/me').set(bearer(owner)).expect(200);
    expect(me.body.data.name).not.toBe('Plain Text');
  });

  it('answers 415 for a form post, before anything is read', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').type('form').send({ email: 'clara@owners.example', password: DEMO_PASSWORD });
    expectProblem(res, 415);
  });

  it('answers 415 for a +json type the parser does not read, instead of ignoring the body', async () => {
    const res = await request(t.app).patch('/api/me').set(bearer(owner)).set('content-type', 'application/merge-patch+json').send('{"name":"Merge Patch"}');
    expectProblem(res, 415);
  });

  it('takes JSON with a charset, and requests without a body and without a type', async () => {
    await request(t.app).patch('/api/me').set(bearer(owner)).set('content-type', 'application/json; charset=utf-8').send('{"name":"Clara Innerhofer"}').expect(200);
    await request(t.app).post('/api/auth/sign-out').expect((r) => expect(r.status).toBeLessThan(300));
    await request(t.app).get('/api/me').set(bearer(owner)).set('content-type', 'text/plain').expect(200);
  });

  it('keeps multipart uploads working and refuses JSON on an upload route', async () => {
    const res = await request(t.app).post(`/api/orgs/${partner.orgId}/documents`).set(bearer(partner.admin)).send({ kind: 'registration' });
    expectProblem(res, 415);
  });
});

describe('serving the built apps', () => {
  let dir: string;
  let served: TestApp;
  beforeAll(async () => {
    dir = mkdtempSync(path.join(tmpdir(), 'emberline-apps-'));
    mkdirSync(path.join(dir, 'assets'));
    mkdirSync(path.join(dir, 'apps/console'), { recursive: true });
    writeFileSync(path.join(dir, 'index.html'), '<!doctype html><title>directory</title>');
    writeFileSync(path.join(dir, 'apps/console/index.html'), '<!doctype html><title>console</title>');
    writeFileSync(path.join(dir, 'assets/app-1.js'), 'console.log(1)');
    served = await createTestApp({ SERVE_APPS: 'true', APPS_DIR: dir });
  });
  afterAll(async () => {
    await served.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('answers a missing asset with a plain 404', async () => {
    const res = await request(served.app).get('/assets/x.js');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/^text\/plain/);
    expect(res.text).not.toMatch(/\n\s+at |[\\/]assets[\\/]/);
  });

  it('answers a malformed asset path with a plain 404', async () => {
    const res = await request(served.app).get('/assets/%E0%A4%A.js');
    expect(res.status).toBe(404);
    expect(res.text).not.toMatch(/\n\s+at /);
  });

  it('allows styles only from this origin (and inline, for the UI kit), not from any https: host', async () => {
    const csp = String((await request(served.app).get('/search').expect(200)).headers['content-security-policy']);
    const styleSrc = csp.split(';').map((d) => d.trim()).find((d) => d.startsWith('style-src'));
    expect(styleSrc?.split(/\s+/).sort()).toEqual(["'self'", "'unsafe-inline'", 'style-src'].sort());
  });

  it('still serves assets and both apps', async () => {
    await request(served.app).get('/assets/app-1.js').expect(200);
    expect((await request(served.app).get('/search').expect(200)).text).toContain('directory');
    expect((await request(served.app).get('/console/bookings').expect(200)).text).toContain('console');
  });
});
