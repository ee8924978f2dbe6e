// Tenant isolation matrix. It enumerates every /api/orgs/{orgId} operation from the OpenAPI
// document, so a route added later is covered automatically — or fails here until someone says
// how to call it. A member of organisation A calling with B's id, or with B's record ids under
// A's id, must get 404 with none of B's data, and nothing in the database may change.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/app';
import { linkFromMail, partnerWithTeam, uniqueEmail, type SignedIn } from '../setup/accounts';

let t: TestApp;
type Org = Awaited<ReturnType<typeof partnerWithTeam>> & { invitationId: string; name: string; invitee: string };
let A: Org;
let B: Org;

async function organisation(): Promise<Org> {
  const o = await partnerWithTeam(t.app, t.dataSource, { technician: true });
  const invitee = uniqueEmail('pending');
  const inv = await request(t.app).post(`/api/orgs/${o.orgId}/invitations`).auth(o.admin.accessToken, { type: 'bearer' }).send({ email: invitee, role: 'technician' }).expect(201);
  await linkFromMail(t.dataSource, invitee, 'invitation');
  const [row] = await t.dataSource.query('SELECT name FROM organisation WHERE id = ?', [o.orgId]);
  return { ...o, invitationId: inv.body.data.id, name: row.name, invitee };
}

/** How to fill each path parameter with a record of the *other* organisation. */
const recordOf: Record<string, (o: Org) => string> = {
  userId: (o) => o.technician!.userId,
  invitationId: (o) => o.invitationId,
};

/** A valid body for each operation that takes one, so refusals are about tenancy, not validation. */
const sampleBodies: Record<string, () => object> = {
  'post /api/orgs/{orgId}/invitations': () => ({ email: uniqueEmail('probe'), role: 'technician' }),
  'patch /api/orgs/{orgId}/members/{userId}': () => ({ role: 'partner_admin' }),
};

interface Operation {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  params: string[];
  hasBody: boolean;
}

let operations: Operation[] = [];

async function fingerprint(): Promise<string> {
  const rows: { Table: string; Checksum: number }[] = await t.dataSource.query('CHECKSUM TABLE organisation, membership, invitation, user_account, audit_log, mail_outbox, refresh_token');
  return rows.map((r) => `${r.Table}:${r.Checksum}`).join(',');
}

function fill(op: Operation, orgId: string, records: Org): string {
  return op.path.replace(/\{(\w+)\}/g, (_m, name: string) => (name === 'orgId' ? orgId : recordOf[name]!(records)));
}

async function call(op: Operation, url: string, who?: SignedIn) {
  let req = request(t.app)[op.method](url);
  if (who) req = req.set('authorization', `Bearer ${who.accessToken}`);
  if (op.hasBody) req = req.send(sampleBodies[`${op.method} ${op.path}`]!());
  return req;
}

function expectNothingOf(res: request.Response, other: Org) {
  // `instance` only echoes the URL the caller sent; everything else must say nothing of B
  const text = JSON.stringify({ ...res.body, instance: undefined });
  for (const secret of [other.name, other.admin.email, other.technician!.email, other.invitee, other.technician!.userId, other.invitationId]) {
    expect(text).not.toContain(secret);
  }
}

beforeAll(async () => {
  t = await createTestApp();
  [A, B] = [await organisation(), await organisation()];
  const doc = (await request(t.app).get('/api/openapi.json').expect(200)).body as { paths: Record<string, Record<string, { requestBody?: unknown }>> };
  for (const [path, item] of Object.entries(doc.paths)) {
    if (!path.startsWith('/api/orgs/{orgId}')) continue;
    for (const [method, spec] of Object.entries(item)) {
      operations.push({ method: method as Operation['method'], path, params: [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]!), hasBody: !!spec.requestBody });
    }
  }
}, 60_000);
afterAll(() => t.close());

describe('tenant isolation matrix', () => {
  it('finds the organisation routes and knows how to call each one', () => {
    expect(operations.length).toBeGreaterThanOrEqual(6);
    for (const op of operations) {
      for (const p of op.params) if (p !== 'orgId') expect(recordOf[p], `no record sample for {${p}} in ${op.method} ${op.path}: add one to recordOf`).toBeDefined();
      if (op.hasBody) expect(sampleBodies[`${op.method} ${op.path}`], `no sample body for ${op.method} ${op.path}: add one to sampleBodies`).toBeDefined();
    }
  });

  it('refuses every route with another organisation\'s id (admin and technician of A)', async () => {
    for (const who of [A.admin, A.technician!]) {
      for (const op of operations) {
        const before = await fingerprint();
        const res = await call(op, fill(op, B.orgId, B), who);
        expect(res.status, `${op.method} ${op.path} as ${who.email}`).toBe(404);
        expectNothingOf(res, B);
        expect(await fingerprint(), `${op.method} ${op.path} changed data`).toBe(before);
      }
    }
  });

  it('refuses B\'s record ids under A\'s own organisation id', async () => {
    for (const op of operations.filter((o) => o.params.length > 1)) {
      const before = await fingerprint();
      const res = await call(op, fill(op, A.orgId, B), A.admin);
      expect(res.status, `${op.method} ${op.path}`).toBe(404);
      expectNothingOf(res, B);
      expect(await fingerprint(), `${op.method} ${op.path} changed data`).toBe(before);
    }
  });

  it('refuses a made-up organisation id the same way as a real one', async () => {
    for (const op of operations) {
      const res = await call(op, fill(op, '00000000-0000-4000-8000-000000000000', B), A.admin);
      expect(res.status, `${op.method} ${op.path}`).toBe(404);
    }
  });

  it('asks anyone not signed in to sign in, without touching data', async () => {
    for (const op of operations) {
      const before = await fingerprint();
      const res = await call(op, fill(op, B.orgId, B));
      expect(res.status, `${op.method} ${op.path}`).toBe(401);
      expect(await fingerprint()).toBe(before);
    }
  });

  it('still lets each organisation use its own routes (the matrix is not refusing everything)', async () => {
    for (const op of operations.filter((o) => o.method === 'get')) {
      const res = await call(op, fill(op, A.orgId, A), A.admin);
      expect(res.status, `${op.method} ${op.path}`).toBe(200);
      const text = JSON.stringify(res.body);
      expect(text.includes(A.orgId) || text.includes(A.admin.email), `${op.method} ${op.path} shows A's own data`).toBe(true);
    }
  });
});
