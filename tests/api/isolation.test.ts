// Tenant isolation matrix. It enumerates every /api/orgs/{orgId} operation from the OpenAPI
// document, so a route added later is covered automatically — or fails here until someone says
// how to call it. A member of organisation A calling with B's id, or with B's record ids under
// A's id, must get 404 with none of B's data, and nothing in the database may change.
import { readdirSync } from 'node:fs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/app';
import { linkFromMail, partnerWithTeam, signUpAndVerify, uniqueEmail, type SignedIn } from '../setup/accounts';
import { isoDay, pdfBytes } from '../setup/files';
import { AREA, BUSINESS, CAPABILITIES, upload } from '../setup/onboarding';
import { insertBooking } from '../setup/bookings';

let t: TestApp;
type Org = Awaited<ReturnType<typeof partnerWithTeam>> & { invitationId: string; name: string; invitee: string; documentId: string; offerId: string; partId: string; bookingId: string; bookingReference: string };
let A: Org;
let B: Org;

async function organisation(): Promise<Org> {
  const o = await partnerWithTeam(t.app, t.dataSource, { technician: true });
  const invitee = uniqueEmail('pending');
  const inv = await request(t.app).post(`/api/orgs/${o.orgId}/invitations`).auth(o.admin.accessToken, { type: 'bearer' }).send({ email: invitee, role: 'technician' }).expect(201);
  await linkFromMail(t.dataSource, invitee, 'invitation');
  const [row] = await t.dataSource.query('SELECT name FROM organisation WHERE id = ?', [o.orgId]);
  // the document's bytes carry the organisation id, so its own download can be recognised
  const doc = await upload(t.app, o.admin, o.orgId, { kind: 'registration' }, { bytes: pdfBytes('Registration', o.orgId), name: 'registration.pdf' }).expect(201);
  // an offer (of a service type the sample equipment covers) with a part in its kit
  await request(t.app).put(`/api/orgs/${o.orgId}/application/capabilities`).auth(o.admin.accessToken, { type: 'bearer' }).send(CAPABILITIES).expect(200);
  const part = await request(t.app).post(`/api/orgs/${o.orgId}/parts`).auth(o.admin.accessToken, { type: 'bearer' }).send(PART).expect(201);
  const offer = await request(t.app)
    .post(`/api/orgs/${o.orgId}/offers`)
    .auth(o.admin.accessToken, { type: 'bearer' })
    .send({ ...OFFER, technicianUserIds: [o.technician!.userId], partsKit: [{ partId: part.body.data.id, quantity: 1 }] })
    .expect(201);
  // a booking of the organisation (written directly: the matrix is about tenancy, not payments);
  // its customer is the partner admin, so the organisation's own CSV export names them
  const owner = await signUpAndVerify(t.app, t.dataSource, 'owner');
  const booking = await insertBooking(t.dataSource, {
    orgId: o.orgId,
    technicianId: o.technician!.userId,
    ownerId: owner.userId,
    offerId: offer.body.data.id,
    start: new Date(Date.now() + 14 * 86_400_000),
    customerName: `Customer of ${row.name}`,
    customerEmail: o.admin.email,
  });
  return { ...o, invitationId: inv.body.data.id, name: row.name, invitee, documentId: doc.body.data.id, offerId: offer.body.data.id, partId: part.body.data.id, bookingId: booking.id, bookingReference: booking.reference };
}

const PART = { name: 'Probe handset', partType: 'handset', unitPriceMinor: 1500, currency: 'EUR', stock: 4 };
const OFFER = {
  serviceTypeCode: 'handset-pairing',
  priceMinor: 4500,
  currency: 'EUR',
  durationMinutes: 30,
  technicianUserIds: [],
  partsKit: [],
  deposit: { kind: 'none' },
  cancellation: { freeUntilHours: 24, feeMinor: 0 },
};
const HOURS = {
  timeZone: 'Europe/Vienna',
  weekly: { monday: [{ start: '08:00', end: '17:00' }] },
  minimumNoticeMinutes: 60,
  bookingHorizonDays: 30,
  bufferMinutes: 15,
};

/** How to fill each path parameter with a record of the *other* organisation. */
const recordOf: Record<string, (o: Org) => string> = {
  userId: (o) => o.technician!.userId,
  invitationId: (o) => o.invitationId,
  documentId: (o) => o.documentId,
  offerId: (o) => o.offerId,
  partId: (o) => o.partId,
  bookingId: (o) => o.bookingId,
};

/** A valid body for each operation that takes one, so refusals are about tenancy, not validation. */
const sampleBodies: Record<string, () => object> = {
  'post /api/orgs/{orgId}/invitations': () => ({ email: uniqueEmail('probe'), role: 'technician' }),
  'patch /api/orgs/{orgId}/members/{userId}': () => ({ role: 'partner_admin' }),
  'put /api/orgs/{orgId}/application/business': () => BUSINESS,
  'put /api/orgs/{orgId}/application/area': () => AREA,
  'put /api/orgs/{orgId}/application/capabilities': () => CAPABILITIES,
  'post /api/orgs/{orgId}/offers': () => OFFER,
  'patch /api/orgs/{orgId}/offers/{offerId}': () => ({ priceMinor: 5000 }),
  'post /api/orgs/{orgId}/parts': () => PART,
  'patch /api/orgs/{orgId}/parts/{partId}': () => ({ stock: 3 }),
  'put /api/orgs/{orgId}/service-area': () => AREA,
  'put /api/orgs/{orgId}/booking-settings': () => ({ autoConfirmBookings: false }),
  'put /api/orgs/{orgId}/travel-policy': () => ({ freeWithinKm: 20, ratePerKmMinor: 80, currency: 'EUR', maxDistanceKm: 150 }),
  'put /api/orgs/{orgId}/technicians/{userId}/hours': () => HOURS,
  'post /api/orgs/{orgId}/bookings/{bookingId}/decision': () => ({ action: 'accept' }),
};

/** Text fields and a real file for each multipart/form-data operation. */
const sampleUploads: Record<string, () => { fields: Record<string, string>; file: Buffer; name: string }> = {
  'post /api/orgs/{orgId}/documents': () => ({ fields: { kind: 'insurance', expiresOn: isoDay(120) }, file: pdfBytes('Probe certificate'), name: 'probe.pdf' }),
};

interface Operation {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  params: string[];
  hasBody: boolean;
  multipart: boolean;
}

const operations: Operation[] = [];

async function fingerprint(): Promise<string> {
  const rows: { Table: string; Checksum: number }[] = await t.dataSource.query(
    'CHECKSUM TABLE organisation, membership, invitation, user_account, audit_log, mail_outbox, refresh_token, partner_profile, organisation_capability, partner_document, offer, offer_technician, part, offer_part, travel_policy, working_hours, booking, booking_event, payment_event',
  );
  // stored files count too: a refused upload must not leave one behind
  const files = readdirSync(t.uploadsDir, { recursive: true }).map(String).sort().join(',');
  return `${rows.map((r) => `${r.Table}:${r.Checksum}`).join(',')}|${files}`;
}

function fill(op: Operation, orgId: string, records: Org): string {
  return op.path.replace(/\{(\w+)\}/g, (_m, name: string) => (name === 'orgId' ? orgId : recordOf[name]!(records)));
}

function call(op: Operation, url: string, who?: SignedIn): request.Test {
  let req = request(t.app)[op.method](url);
  if (who) req = req.set('authorization', `Bearer ${who.accessToken}`);
  if (op.multipart) {
    const sample = sampleUploads[`${op.method} ${op.path}`]!();
    for (const [name, value] of Object.entries(sample.fields)) req = req.field(name, value);
    req = req.attach('file', sample.file, { filename: sample.name, contentType: 'application/pdf' });
  } else if (op.hasBody) req = req.send(sampleBodies[`${op.method} ${op.path}`]!());
  return req;
}

function expectNothingOf(res: request.Response, other: Org) {
  // `instance` only echoes the URL the caller sent; everything else must say nothing of B
  const text = JSON.stringify({ ...res.body, instance: undefined });
  for (const secret of [other.name, other.admin.email, other.technician!.email, other.invitee, other.technician!.userId, other.invitationId, other.documentId, other.bookingReference]) {
    expect(text).not.toContain(secret);
  }
}

beforeAll(async () => {
  t = await createTestApp();
  [A, B] = [await organisation(), await organisation()];
  const doc = (await request(t.app).get('/api/openapi.json').expect(200)).body as { paths: Record<string, Record<string, { requestBody?: { content: Record<string, unknown> } }>> };
  for (const [path, item] of Object.entries(doc.paths)) {
    if (!path.startsWith('/api/orgs/{orgId}')) continue;
    for (const [method, spec] of Object.entries(item)) {
      operations.push({
        method: method as Operation['method'],
        path,
        params: [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]!),
        hasBody: !!spec.requestBody,
        multipart: !!spec.requestBody?.content['multipart/form-data'],
      });
    }
  }
}, 60_000);
afterAll(() => t.close());

describe('tenant isolation matrix', () => {
  it('finds the organisation routes and knows how to call each one', () => {
    expect(operations.length).toBeGreaterThanOrEqual(14);
    expect(operations.filter((o) => o.multipart).map((o) => o.path)).toContain('/api/orgs/{orgId}/documents');
    for (const op of operations) {
      for (const p of op.params) if (p !== 'orgId') expect(recordOf[p], `no record sample for {${p}} in ${op.method} ${op.path}: add one to recordOf`).toBeDefined();
      if (op.multipart) expect(sampleUploads[`${op.method} ${op.path}`], `no sample upload for ${op.method} ${op.path}: add one to sampleUploads`).toBeDefined();
      else if (op.hasBody) expect(sampleBodies[`${op.method} ${op.path}`], `no sample body for ${op.method} ${op.path}: add one to sampleBodies`).toBeDefined();
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
      const res = await call(op, fill(op, A.orgId, A), A.admin).buffer(true).parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
      expect(res.status, `${op.method} ${op.path}`).toBe(200);
      // JSON answers name A's id or e-mail; files (A's document) carry A's id in their bytes
      const text = (res.body as Buffer).toString('latin1');
      expect(text.includes(A.orgId) || text.includes(A.admin.email), `${op.method} ${op.path} shows A's own data`).toBe(true);
    }
  });
});
