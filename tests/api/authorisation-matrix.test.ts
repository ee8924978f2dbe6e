// Authorisation matrix generated from the route table: every operation in the API's OpenAPI
// registry × anonymous, owner, technician, partner admin and network admin (demo accounts),
// checked against the outcome written down in MATRIX. A route without a row fails here until
// someone writes down who may call it. Runs on a database of its own seeded with the demo, since
// the allowed calls change things (a partner admin deletes an offer) that other files read.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrateAndSeed } from '../../apps/api/src/db/migrate';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { LocalDiskStorage } from '../../apps/api/src/storage';
import { signIn, type SignedIn } from '../setup/accounts';
import { createTestApp, type TestApp } from '../setup/app';
import { scratchDatabase, type ScratchDatabase } from '../setup/scratch-database';

type Role = 'anonymous' | 'owner' | 'technician' | 'partnerAdmin' | 'networkAdmin';
/** Partner admins last: what they may change (delete an offer) happens after the others were refused. */
const ROLES: Role[] = ['anonymous', 'owner', 'technician', 'networkAdmin', 'partnerAdmin'];
const COLUMN = { anonymous: 0, owner: 1, technician: 2, partnerAdmin: 3, networkAdmin: 4 } as const satisfies Record<Role, number>;

/**
 * - `ok`: allowed with the caller's own records (neither 401, 403 nor 404, nor a crash); where the
 *   path names a tenant's records, the same call with another tenant's answers 404.
 * - `all`: allowed whoever's records the path names (public routes; network admins in any organisation).
 * - `pass`: allowed, but the sample names nothing real (a made-up token), so 404 is the right answer.
 * - `401`, `403`, `404`: refused with that status as problem details (404: not even told it exists);
 *   with another tenant's records refused too (401, 403 or 404).
 */
type Outcome = 'ok' | 'all' | 'pass' | 401 | 403 | 404;
/** [anonymous, owner, technician, partner admin, network admin] */
type Row = readonly [Outcome, Outcome, Outcome, Outcome, Outcome];

const PUBLIC: Row = ['all', 'all', 'all', 'all', 'all'];
const SIGNED_IN: Row = [401, 'ok', 'ok', 'ok', 'ok'];
const OWNER: Row = [401, 'ok', 403, 403, 403];
const NETWORK_ADMIN: Row = [401, 403, 403, 403, 'ok'];
/** The whole team reads; network admins read any organisation; owners are not members (404). */
const ORG_READ: Row = [401, 404, 'ok', 'ok', 'all'];
/** Partner admins change; a network admin gets into the organisation but holds no role there. */
const ORG_WRITE: Row = [401, 404, 403, 'ok', 403];

const MATRIX: Record<string, Row> = {
  // the provider's signature is the credential: without one it is 400, whoever calls
  'post /api/payments/webhook': PUBLIC,
  'get /api/health': PUBLIC,
  'get /api/catalogue/service-types': PUBLIC,
  'get /api/catalogue/service-types/{code}': PUBLIC,
  'get /api/catalogue/capabilities': PUBLIC,
  'post /api/auth/sign-up': PUBLIC,
  'post /api/auth/partner-sign-up': PUBLIC,
  'post /api/auth/resend-verification': PUBLIC,
  'post /api/auth/sign-in': PUBLIC,
  // the refresh cookie is the credential, not the bearer token; the matrix sends none
  'post /api/auth/refresh': [401, 401, 401, 401, 401],
  'post /api/auth/sign-out': PUBLIC,
  'post /api/auth/verify-email': PUBLIC,
  'post /api/auth/forgot-password': PUBLIC,
  'post /api/auth/reset-password': PUBLIC,
  'get /api/auth/invitations/{token}': ['pass', 'pass', 'pass', 'pass', 'pass'],
  'post /api/auth/invitations/accept': PUBLIC,
  'get /api/me': SIGNED_IN,
  'patch /api/me': SIGNED_IN,
  'get /api/me/vehicles': OWNER,
  'post /api/me/vehicles': OWNER,
  'patch /api/me/vehicles/{vehicleId}': OWNER,
  'delete /api/me/vehicles/{vehicleId}': OWNER,
  'get /api/orgs/{orgId}': ORG_READ,
  'get /api/orgs/{orgId}/team': ORG_READ,
  'post /api/orgs/{orgId}/invitations': ORG_WRITE,
  'delete /api/orgs/{orgId}/invitations/{invitationId}': ORG_WRITE,
  'patch /api/orgs/{orgId}/members/{userId}': ORG_WRITE,
  'delete /api/orgs/{orgId}/members/{userId}': ORG_WRITE,
  'get /api/admin/mail-log': NETWORK_ADMIN,
  'get /api/admin/audit-log': NETWORK_ADMIN,
  'get /api/orgs/{orgId}/application': ORG_READ,
  'put /api/orgs/{orgId}/application/business': ORG_WRITE,
  'put /api/orgs/{orgId}/application/area': ORG_WRITE,
  'put /api/orgs/{orgId}/application/capabilities': ORG_WRITE,
  'post /api/orgs/{orgId}/application/submit': ORG_WRITE,
  'post /api/orgs/{orgId}/documents': ORG_WRITE,
  // the organisation's own papers (registration, insurance): its whole team may open them
  'get /api/orgs/{orgId}/documents/{documentId}/file': ORG_READ,
  'delete /api/orgs/{orgId}/documents/{documentId}': ORG_WRITE,
  'get /api/admin/applications': NETWORK_ADMIN,
  'get /api/admin/applications/{orgId}': NETWORK_ADMIN,
  'put /api/admin/applications/{orgId}/review': NETWORK_ADMIN,
  'post /api/admin/applications/{orgId}/decision': NETWORK_ADMIN,
  'get /api/admin/capabilities': NETWORK_ADMIN,
  'post /api/admin/capabilities': NETWORK_ADMIN,
  'patch /api/admin/capabilities/{code}': NETWORK_ADMIN,
  'get /api/partners': PUBLIC,
  'get /api/partners/{partnerId}': PUBLIC,
  'get /api/partners/{partnerId}/slots': PUBLIC,
  'get /api/orgs/{orgId}/offers': ORG_READ,
  'post /api/orgs/{orgId}/offers': ORG_WRITE,
  'get /api/orgs/{orgId}/offers/{offerId}': ORG_READ,
  'patch /api/orgs/{orgId}/offers/{offerId}': ORG_WRITE,
  'delete /api/orgs/{orgId}/offers/{offerId}': ORG_WRITE,
  'get /api/orgs/{orgId}/parts': ORG_READ,
  'post /api/orgs/{orgId}/parts': ORG_WRITE,
  'patch /api/orgs/{orgId}/parts/{partId}': ORG_WRITE,
  'delete /api/orgs/{orgId}/parts/{partId}': ORG_WRITE,
  'get /api/orgs/{orgId}/booking-settings': ORG_READ,
  'put /api/orgs/{orgId}/booking-settings': ORG_WRITE,
  'get /api/orgs/{orgId}/travel-policy': ORG_READ,
  'put /api/orgs/{orgId}/travel-policy': ORG_WRITE,
  'get /api/orgs/{orgId}/service-area': ORG_READ,
  'put /api/orgs/{orgId}/service-area': ORG_WRITE,
  'get /api/orgs/{orgId}/technicians/{userId}/hours': ORG_READ,
  'put /api/orgs/{orgId}/technicians/{userId}/hours': ORG_WRITE,
  'get /api/search': PUBLIC,
  'get /api/places': PUBLIC,
  'post /api/coverage-alerts': PUBLIC,
  'get /api/admin/coverage-gaps': NETWORK_ADMIN,
  // public; a bearer token, when sent, only shows an admin more
  'get /api/catalogue/eligibility-rules': PUBLIC,
  'post /api/admin/eligibility-rules': NETWORK_ADMIN,
  'put /api/admin/eligibility-rules/{code}': NETWORK_ADMIN,
  'delete /api/admin/eligibility-rules/{code}': NETWORK_ADMIN,
  'get /api/partners/{partnerId}/quote': PUBLIC,
  'post /api/bookings': OWNER,
  'get /api/bookings': OWNER,
  'get /api/bookings/{bookingId}': OWNER,
  'get /api/bookings/{bookingId}/calendar.ics': OWNER,
  'post /api/bookings/{bookingId}/cancel': OWNER,
  'post /api/bookings/{bookingId}/reschedule': OWNER,
  'post /api/bookings/{bookingId}/release': OWNER,
  // a technician's own jobs only (another technician's are 404: see the tests below the matrix)
  'get /api/orgs/{orgId}/bookings': ORG_READ,
  'get /api/orgs/{orgId}/bookings.csv': ORG_READ,
  'get /api/orgs/{orgId}/bookings/{bookingId}': ORG_READ,
  // a technician decides on the jobs assigned to them; network admins watch, they do not decide
  'post /api/orgs/{orgId}/bookings/{bookingId}/decision': [401, 404, 'ok', 'ok', 403],
};

/** Bodies where an empty one would stop short of what is being checked; every other body is `{}`. */
const BODIES: Record<string, () => object> = {
  'post /api/auth/sign-in': () => ({ email: 'clara@owners.example', password: DEMO_PASSWORD }),
  'patch /api/orgs/{orgId}/members/{userId}': () => ({ role: 'technician' }),
  // the sample booking is confirmed already: 409 once the caller was let through to the booking
  'post /api/orgs/{orgId}/bookings/{bookingId}/decision': () => ({ action: 'accept' }),
  // the owner's booking is looked up after the body is read: a bad body would be 400 for anyone's
  'post /api/bookings/{bookingId}/reschedule': () => ({ start: new Date(Date.now() + 30 * 86_400_000).toISOString() }),
  // technicians pass the route's guard (their own time off is theirs): the service decides on a valid body
  'put /api/orgs/{orgId}/technicians/{userId}/hours': () => ({
    timeZone: 'Europe/Vienna',
    weekly: { monday: [{ start: '07:00', end: '11:00' }], tuesday: [], wednesday: [], thursday: [], friday: [], saturday: [], sunday: [] },
    exceptions: [],
    minimumNoticeMinutes: 120,
    bookingHorizonDays: 60,
    bufferMinutes: 15,
  }),
};

/** Express routes the registry does not document on purpose (the document itself and its page). */
const UNDOCUMENTED = ['get /api/openapi.json', 'get /api/docs'];

interface Records {
  org: string;
  /** A job of the organisation assigned to the technician who signs in. */
  orgBooking: string;
  /** A booking the owner who signs in made (completed: nothing the matrix does can change it). */
  ownerBooking: string;
  vehicle: string;
  invitation: string;
  document: string;
  offer: string;
  part: string;
  /** A member the partner admin may change or remove (not the one who signs in as technician). */
  member: string;
  technician: string;
}

interface Operation {
  key: string;
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  hasBody: boolean;
  /** Names a tenant's records: the organisation under /orgs, someone's booking or vehicle. */
  scoped: boolean;
}

let scratch: ScratchDatabase;
let uploads: string;
let t: TestApp;
let who: Record<Exclude<Role, 'anonymous'>, SignedIn>;
let own: Records;
let other: Records;
let pendingOrg: string;
let approvedPartner: string;
let kaltstartRefs: Record<string, string>;
const operations: Operation[] = [];

const one = async <T = Record<string, string>>(sql: string, params: unknown[]): Promise<T> => {
  const [row] = await t.dataSource.query(sql, params);
  expect(row, `${sql} ${JSON.stringify(params)}`).toBeDefined();
  return row as T;
};
const idOf = async (sql: string, params: unknown[]) => (await one<{ id: string }>(sql, params)).id;
const userId = (email: string) => idOf('SELECT id FROM user_account WHERE email = ?', [email]);
const bookingId = (reference: string) => idOf('SELECT id FROM booking WHERE reference = ?', [reference]);

async function records(orgName: string, admin: SignedIn, o: { technician: string; member: string; orgBooking: string; owner: string; ownerBooking: string }): Promise<Records> {
  const org = await idOf('SELECT id FROM organisation WHERE name = ?', [orgName]);
  const invitation = await request(t.app).post(`/api/orgs/${org}/invitations`).auth(admin.accessToken, { type: 'bearer' }).send({ email: `matrix-${Date.now()}@test.example`, role: 'technician' }).expect(201);
  return {
    org,
    orgBooking: await bookingId(o.orgBooking),
    ownerBooking: await bookingId(o.ownerBooking),
    vehicle: await idOf('SELECT id FROM vehicle WHERE owner_user_id = ? ORDER BY id LIMIT 1', [await userId(o.owner)]),
    invitation: invitation.body.data.id,
    document: await idOf('SELECT id FROM partner_document WHERE organisation_id = ? ORDER BY id LIMIT 1', [org]),
    offer: await idOf('SELECT id FROM offer WHERE organisation_id = ? ORDER BY id LIMIT 1', [org]),
    part: await idOf('SELECT id FROM part WHERE organisation_id = ? ORDER BY id LIMIT 1', [org]),
    member: await userId(o.member),
    technician: await userId(o.technician),
  };
}

/** The value of a path parameter: the caller's own records, or another tenant's. */
function param(op: Operation, name: string, r: Records): string {
  const admin = op.path.startsWith('/api/admin/');
  switch (name) {
    case 'orgId':
      return admin ? pendingOrg : r.org;
    case 'bookingId':
      return op.path.startsWith('/api/orgs/') ? r.orgBooking : r.ownerBooking;
    case 'userId':
      return op.path.includes('/members/') ? r.member : r.technician;
    case 'vehicleId':
      return r.vehicle;
    case 'invitationId':
      return r.invitation;
    case 'documentId':
      return r.document;
    case 'offerId':
      return r.offer;
    case 'partId':
      return r.part;
    case 'partnerId':
      return approvedPartner;
    case 'token':
      return 'made-up-invitation-token-0123456789abcdefghijk';
    case 'code':
      if (op.path.startsWith('/api/catalogue/service-types/')) return 'handset-pairing';
      if (op.path.startsWith('/api/admin/capabilities/')) return 'vci-pass-thru';
      if (op.path.startsWith('/api/admin/eligibility-rules/')) return 'already-a-parking-heater';
  }
  throw new Error(`no sample for {${name}} in ${op.key}: add one to param()`);
}

const fill = (op: Operation, r: Records) => op.path.replace(/\{(\w+)\}/g, (_m, name: string) => param(op, name, r));

function call(op: Operation, url: string, role: Role): request.Test {
  let req = request(t.app)[op.method](url);
  if (role !== 'anonymous') req = req.set('authorization', `Bearer ${who[role].accessToken}`);
  if (op.hasBody) req = req.send(BODIES[op.key]?.() ?? {});
  return req;
}

const answer = (res: request.Response) => `answered ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`;

/** Why a refusal is not what was written down, or null. */
function refusedProblem(res: request.Response, status: number | number[]): string | null {
  if (!([] as number[]).concat(status).includes(res.status)) return `expected ${String(status)}, ${answer(res)}`;
  if (!/^application\/problem\+json/.test(String(res.headers['content-type']))) return `${res.status} without problem details (${res.headers['content-type']})`;
  const body = res.body as { status?: unknown; title?: unknown; code?: unknown };
  if (body.status !== res.status || typeof body.title !== 'string' || typeof body.code !== 'string') return `problem details without status, title and code: ${answer(res)}`;
  return null;
}

/** Why an allowed call does not look let through, or null. */
function allowedProblem(res: request.Response, outcome: 'ok' | 'all' | 'pass'): string | null {
  const refused = outcome === 'pass' ? [401, 403] : [401, 403, 404];
  if (refused.includes(res.status)) return `expected ${outcome}, ${answer(res)}`;
  // a crash says nothing about whether the guards let the caller through
  if (res.status === 500) return `crashed: ${answer(res)}`;
  return null;
}

function expectRefused(res: request.Response, status: number, what: string) {
  expect(refusedProblem(res, status), what).toBeNull();
}

/** Every METHOD path Express serves under /api, whatever declared it. */
function expressRoutes(): string[] {
  const found: string[] = [];
  type Layer = { route?: { path: string; methods: Record<string, boolean> }; handle?: { stack?: Layer[] } };
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) for (const method of Object.keys(layer.route.methods)) found.push(`${method} /api${layer.route.path.replace(/:(\w+)/g, '{$1}')}`);
      else if (layer.handle?.stack) walk(layer.handle.stack);
    }
  };
  walk((t.app as unknown as { router: { stack: Layer[] } }).router.stack);
  return found;
}

beforeAll(async () => {
  scratch = scratchDatabase('authz');
  uploads = mkdtempSync(path.join(tmpdir(), 'emberline-authz-'));
  const storage = new LocalDiskStorage(uploads);
  await migrateAndSeed({ ...scratch.db, NODE_ENV: 'test' }, { passwordHashCost: 4, storage });
  t = await createTestApp(scratch.env, { storage });
  who = {
    owner: await signIn(t.app, 'clara@owners.example', DEMO_PASSWORD),
    technician: await signIn(t.app, 'anja@kaltstart.example', DEMO_PASSWORD),
    partnerAdmin: await signIn(t.app, 'florian@kaltstart.example', DEMO_PASSWORD),
    networkAdmin: await signIn(t.app, 'admin@emberline.example', DEMO_PASSWORD),
  };
  const lena = await signIn(t.app, 'lena@glutwerk.example', DEMO_PASSWORD);
  // own: Kaltstart's team and Clara; another tenant: Glutwerk Mobil and another owner, Max
  own = await records('Kaltstart Service Bayern', who.partnerAdmin, {
    technician: 'anja@kaltstart.example',
    member: 'deniz@kaltstart.example',
    orgBooking: 'EMB-DEMOK1',
    owner: 'clara@owners.example',
    ownerBooking: 'EMB-DEMOC2',
  });
  other = await records('Glutwerk Mobil', lena, {
    technician: 'tobias@glutwerk.example',
    member: 'tobias@glutwerk.example',
    orgBooking: 'EMB-DEMOC1',
    owner: 'max@owners.example',
    ownerBooking: 'EMB-DEMOK4',
  });
  pendingOrg = await idOf('SELECT id FROM organisation WHERE name = ?', ['Alpenglut Technik']);
  approvedPartner = own.org;
  kaltstartRefs = Object.fromEntries(
    ((await t.dataSource.query("SELECT reference, id FROM booking WHERE reference LIKE 'EMB-DEMOK%'")) as { reference: string; id: string }[]).map((r) => [r.reference, r.id]),
  );
  for (const d of t.app.openApiRegistry.definitions) {
    if (d.type !== 'route') continue;
    const { method, path: p, request: req } = d.route;
    operations.push({
      key: `${method} ${p}`,
      method: method as Operation['method'],
      path: p,
      hasBody: !!req?.body,
      scoped: p.startsWith('/api/orgs/') || /\{(bookingId|vehicleId)\}/.test(p),
    });
  }
}, 120_000);

afterAll(async () => {
  await t?.close();
  scratch?.drop();
  rmSync(uploads, { recursive: true, force: true });
});

const referencesOf = (res: request.Response) => (res.body.data as { reference: string }[]).map((b) => b.reference).sort();
const csvReferences = (text: string) =>
  text
    .split('\r\n')
    .slice(1)
    .filter(Boolean)
    .map((line) => line.split(',')[0])
    .sort();

describe('a technician sees their own jobs, a partner admin all of the organisation\'s', () => {
  const ANJA = ['EMB-DEMOK1', 'EMB-DEMOK3', 'EMB-DEMOK5'];
  const ALL = ['EMB-DEMOK1', 'EMB-DEMOK2', 'EMB-DEMOK3', 'EMB-DEMOK4', 'EMB-DEMOK5', 'EMB-DEMOK6'];
  const list = (role: 'technician' | 'partnerAdmin' | 'networkAdmin', query: Record<string, string> = {}) =>
    request(t.app).get(`/api/orgs/${own.org}/bookings`).query(query).auth(who[role].accessToken, { type: 'bearer' }).expect(200);
  const csv = (role: 'technician' | 'partnerAdmin') => request(t.app).get(`/api/orgs/${own.org}/bookings.csv`).auth(who[role].accessToken, { type: 'bearer' }).expect(200);

  it('lists only the jobs assigned to the technician', async () => {
    expect(referencesOf(await list('technician'))).toEqual(ANJA);
    // asking for a colleague's jobs gives nothing, not the colleague's customers
    expect(referencesOf(await list('technician', { technicianId: own.member }))).toEqual([]);
    expect(referencesOf(await list('partnerAdmin'))).toEqual(ALL);
    expect(referencesOf(await list('networkAdmin'))).toEqual(ALL);
  });

  it('exports only the technician\'s jobs as CSV, every job for the partner admin', async () => {
    const mine = (await csv('technician')).text;
    expect(csvReferences(mine)).toEqual(ANJA);
    expect(csvReferences((await csv('partnerAdmin')).text)).toEqual(ALL);
  });

  it('answers 404 for a colleague\'s job, as for another organisation\'s', async () => {
    const colleagues = await request(t.app).get(`/api/orgs/${own.org}/bookings/${kaltstartRefs['EMB-DEMOK2']}`).auth(who.technician.accessToken, { type: 'bearer' });
    expectRefused(colleagues, 404, 'a colleague\'s job');
    expect(JSON.stringify(colleagues.body)).not.toContain('EMB-DEMOK2');
    await request(t.app).get(`/api/orgs/${own.org}/bookings/${kaltstartRefs['EMB-DEMOK1']}`).auth(who.technician.accessToken, { type: 'bearer' }).expect(200);
    await request(t.app).get(`/api/orgs/${own.org}/bookings/${kaltstartRefs['EMB-DEMOK2']}`).auth(who.partnerAdmin.accessToken, { type: 'bearer' }).expect(200);
  });
});

describe('authorisation matrix', () => {
  it('has a row for every documented route, and every route Express serves is documented', () => {
    const keys = operations.map((o) => o.key);
    expect(keys.length).toBeGreaterThanOrEqual(80);
    expect(keys.filter((k) => !MATRIX[k]), 'routes without a row in MATRIX: write down who may call them').toEqual([]);
    expect(Object.keys(MATRIX).filter((k) => !keys.includes(k)), 'rows in MATRIX for routes that are gone').toEqual([]);
    const served = expressRoutes();
    expect(served.length).toBeGreaterThanOrEqual(keys.length);
    expect(served.filter((k) => !keys.includes(k) && !UNDOCUMENTED.includes(k)), 'routes Express serves outside the registry').toEqual([]);
  });

  it('answers every route as written down, for each caller, with their own and another tenant\'s records', async () => {
    const wrong: string[] = [];
    let calls = 0;
    for (const op of operations) {
      const row = MATRIX[op.key];
      if (!row) continue;
      for (const role of ROLES) {
        const outcome = row[COLUMN[role]];
        // another tenant's records first, so that nothing allowed below has changed them yet
        if (op.scoped) {
          const res = await call(op, fill(op, other), role);
          calls++;
          const problem =
            outcome === 'all' ? allowedProblem(res, 'all') : outcome === 'ok' ? refusedProblem(res, 404) : refusedProblem(res, [401, 403, 404]);
          if (problem) wrong.push(`${op.key} as ${role}, another tenant's records: ${problem}`);
        }
        const res = await call(op, fill(op, own), role);
        calls++;
        const problem = typeof outcome === 'number' ? refusedProblem(res, outcome) : allowedProblem(res, outcome);
        if (problem) wrong.push(`${op.key} as ${role}: ${problem}`);
      }
    }
    expect(wrong).toEqual([]);
    expect(calls).toBeGreaterThan(operations.length * ROLES.length);
  }, 120_000);
});
