// Partner onboarding through the API: a partner fills in the application, the network reviews
// it, asks for changes, approves it, and the Directory lists the partner.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/app';
import { partnerWithTeam } from '../setup/accounts';
import { isoDay, pdfBytes, PNG_BYTES } from '../setup/files';
import { AREA, BUSINESS, CAPABILITIES, approvedPartner, bearer, fillApplication, networkAdmin, upload } from '../setup/onboarding';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const paths = (res: request.Response) => (res.body.errors as { path: string }[]).map((e) => e.path).sort();
const mailsTo = async (to: string, template: string): Promise<{ text_body: string }[]> =>
  t.dataSource.query('SELECT text_body FROM mail_outbox WHERE to_address = ? AND template = ? ORDER BY created_at', [to, template]);
const auditActions = async (orgId: string): Promise<string[]> =>
  (await t.dataSource.query('SELECT action FROM audit_log WHERE organisation_id = ? ORDER BY id', [orgId])).map((r: { action: string }) => r.action);

describe('the application, step by step', () => {
  it('starts as an editable draft with everything missing', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const res = await request(t.app).get(`/api/orgs/${orgId}/application`).set(bearer(admin)).expect(200);
    expect(res.body.data).toMatchObject({ organisationId: orgId, status: 'draft', editable: true, business: null, area: null, capabilities: [], documents: [], changeRequest: null, submittedAt: null });
    expect(res.body.data.missing.map((m: { path: string }) => m.path).sort()).toEqual(['area', 'business', 'capabilities', 'documents.insurance', 'documents.registration']);
  });

  it('refuses submitting an incomplete application, listing what is missing', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    await request(t.app).put(`/api/orgs/${orgId}/application/business`).set(bearer(admin)).send(BUSINESS).expect(200);
    const res = await request(t.app).post(`/api/orgs/${orgId}/application/submit`).set(bearer(admin)).expect(400);
    expect(res.body.code).toBe('VALIDATION_FAILED');
    expect(res.headers['content-type']).toContain('application/problem+json');
    expect(paths(res)).toEqual(['area', 'capabilities', 'documents.insurance', 'documents.registration']);
    const [org] = await t.dataSource.query('SELECT status FROM organisation WHERE id = ?', [orgId]);
    expect(org.status).toBe('draft');
  });

  it('validates each step with field errors', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const business = await request(t.app).put(`/api/orgs/${orgId}/application/business`).set(bearer(admin)).send({ ...BUSINESS, vatId: 'ATU00000000', country: 'XX', phone: 'call me' }).expect(400);
    expect(paths(business)).toEqual(['country', 'phone', 'vatId']);
    const area = await request(t.app).put(`/api/orgs/${orgId}/application/area`).set(bearer(admin)).send({ ...AREA, radiusKm: null }).expect(400);
    expect(paths(area)).toEqual(['radiusKm']);
    const workshop = await request(t.app).put(`/api/orgs/${orgId}/application/area`).set(bearer(admin)).send({ ...AREA, mode: 'both', workshopAddress: '' }).expect(400);
    expect(paths(workshop)).toEqual(['workshopAddress']);
  });

  it('accepts only capability codes from the catalogue that are not retired', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const nobody = await networkAdmin(t.app);
    const code = `retired-probe-${Date.now().toString(36)}`;
    await request(t.app).post('/api/admin/capabilities').set(bearer(nobody)).send({ code, name: 'Retired probe', description: '', category: 'measurement', standards: [] }).expect(201);
    await request(t.app).patch(`/api/admin/capabilities/${code}`).set(bearer(nobody)).send({ retired: true }).expect(200);
    const res = await request(t.app)
      .put(`/api/orgs/${orgId}/application/capabilities`)
      .set(bearer(admin))
      .send({ capabilities: [{ code: 'vci-pass-thru' }, { code: 'no-such-kit' }, { code }] })
      .expect(400);
    expect(paths(res)).toEqual(['capabilities.1.code', 'capabilities.2.code']);
    const claimed = await t.dataSource.query('SELECT COUNT(*) AS n FROM organisation_capability WHERE organisation_id = ?', [orgId]);
    expect(Number(claimed[0].n)).toBe(0);
  });

  it('lets technicians read the application but not change it', async () => {
    const { orgId, technician } = await partnerWithTeam(t.app, t.dataSource, { technician: true });
    await request(t.app).get(`/api/orgs/${orgId}/application`).set(bearer(technician!)).expect(200);
    for (const step of ['business', 'area', 'capabilities']) {
      const res = await request(t.app).put(`/api/orgs/${orgId}/application/${step}`).set(bearer(technician!)).send({ ...BUSINESS, ...AREA, ...CAPABILITIES }).expect(403);
      expect(res.body.code).toBe('FORBIDDEN');
    }
    await request(t.app).post(`/api/orgs/${orgId}/application/submit`).set(bearer(technician!)).expect(403);
    const up = await upload(t.app, technician!, orgId, { kind: 'registration' }, { bytes: pdfBytes(), name: 'r.pdf' });
    expect(up.status).toBe(403);
  });
});

describe('the whole journey', () => {
  it('goes from draft through changes requested to approved and into the Directory', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const tradingName = `Glimmspur ${Date.now().toString(36)}`;
    await fillApplication(t.app, admin, orgId, { business: { tradingName } });
    // an equipment photo as evidence, a real PNG
    const photo = await upload(t.app, admin, orgId, { kind: 'evidence', capabilityCode: 'vci-pass-thru' }, { bytes: PNG_BYTES, name: 'interface.png', type: 'image/png' });
    expect(photo.status).toBe(201);
    expect(photo.body.data).toMatchObject({ kind: 'evidence', contentType: 'image/png', fileName: 'interface.png', capabilityCode: 'vci-pass-thru', sizeBytes: PNG_BYTES.length });

    const ready = await request(t.app).get(`/api/orgs/${orgId}/application`).set(bearer(admin)).expect(200);
    expect(ready.body.data.missing).toEqual([]);
    expect(ready.body.data.capabilities.map((c: { code: string }) => c.code).sort()).toEqual(['battery-support-unit', 'digital-multimeter', 'vci-pass-thru']);
    expect(ready.body.data.documents).toHaveLength(3);

    const submitted = await request(t.app).post(`/api/orgs/${orgId}/application/submit`).set(bearer(admin)).expect(200);
    expect(submitted.body.data).toMatchObject({ status: 'submitted', editable: false });
    expect(submitted.body.data.submittedAt).not.toBeNull();
    expect(await mailsTo('admin@emberline.example', 'application-submitted')).toEqual(expect.arrayContaining([expect.objectContaining({ text_body: expect.stringContaining(tradingName) })]));

    // submitted applications are not editable
    const locked = await request(t.app).put(`/api/orgs/${orgId}/application/business`).set(bearer(admin)).send(BUSINESS).expect(409);
    expect(locked.body.code).toBe('NOT_EDITABLE');

    // the network finds it in the queue and reviews it
    const nwa = await networkAdmin(t.app);
    const queue = await request(t.app).get('/api/admin/applications').query({ status: 'submitted', q: tradingName }).set(bearer(nwa)).expect(200);
    expect(queue.body.data).toEqual([expect.objectContaining({ organisationId: orgId, tradingName, country: 'AT', city: 'Innsbruck', status: 'submitted', waitingDays: 0 })]);
    const checklist = { insuranceValid: true, insuranceCoversMobileWork: true, registrationMatches: false, equipmentEvidence: true, identityChecked: true };
    const reviewed = await request(t.app).put(`/api/admin/applications/${orgId}/review`).set(bearer(nwa)).send({ checklist, internalNotes: 'Registration name differs.' }).expect(200);
    expect(reviewed.body.data).toMatchObject({ application: { status: 'in_review' }, checklist, internalNotes: 'Registration name differs.' });

    const changes = await request(t.app)
      .post(`/api/admin/applications/${orgId}/decision`)
      .set(bearer(nwa))
      .send({ decision: 'request_changes', message: 'Please match the legal name to the registration.', fields: { 'business.legalName': 'Write it as in the register.' } })
      .expect(200);
    expect(changes.body.data.application.status).toBe('changes_requested');
    expect((await mailsTo(admin.email, 'application-changes-requested'))[0]!.text_body).toContain('Please match the legal name to the registration.');

    // the partner sees the notes, edits and resubmits
    const seen = await request(t.app).get(`/api/orgs/${orgId}/application`).set(bearer(admin)).expect(200);
    expect(seen.body.data).toMatchObject({
      status: 'changes_requested',
      editable: true,
      changeRequest: { message: 'Please match the legal name to the registration.', fields: { 'business.legalName': 'Write it as in the register.' } },
    });
    // internal notes and the checklist stay with the network
    expect(JSON.stringify(seen.body)).not.toContain('Registration name differs');
    await request(t.app).put(`/api/orgs/${orgId}/application/business`).set(bearer(admin)).send({ ...BUSINESS, tradingName, legalName: 'Glimmspur Heiztechnik Eva Moser e.U.' }).expect(200);
    const again = await request(t.app).post(`/api/orgs/${orgId}/application/submit`).set(bearer(admin)).expect(200);
    expect(again.body.data).toMatchObject({ status: 'submitted', changeRequest: null, business: { legalName: 'Glimmspur Heiztechnik Eva Moser e.U.' } });

    // not yet in the Directory
    const before = await request(t.app).get('/api/partners').expect(200);
    expect(before.body.data.map((p: { id: string }) => p.id)).not.toContain(orgId);

    const approved = await request(t.app).post(`/api/admin/applications/${orgId}/decision`).set(bearer(nwa)).send({ decision: 'approve' }).expect(200);
    expect(approved.body.data.application.status).toBe('approved');
    expect(await mailsTo(admin.email, 'application-approved')).toHaveLength(1);

    const after = await request(t.app).get('/api/partners').expect(200);
    expect(after.body.data).toContainEqual({
      id: orgId,
      tradingName,
      city: 'Innsbruck',
      country: 'AT',
      baseLat: AREA.baseLat,
      baseLng: AREA.baseLng,
      mode: 'mobile',
      radiusKm: 80,
      capabilities: ['battery-support-unit', 'digital-multimeter', 'vci-pass-thru'],
    });

    // every step is in the organisation's history, which the admin view shows newest first
    const detail = await request(t.app).get(`/api/admin/applications/${orgId}`).set(bearer(nwa)).expect(200);
    const history = detail.body.data.history.map((h: { action: string }) => h.action);
    expect(history.slice(0, 3)).toEqual(['application.approve', 'application.submit', 'application.save-business']);
    expect(await auditActions(orgId)).toEqual(expect.arrayContaining(['application.review', 'application.request-changes', 'document.upload', 'application.save-area', 'application.save-capabilities']));
    const decision = detail.body.data.history.find((h: { action: string }) => h.action === 'application.approve');
    expect(decision).toMatchObject({ actorUserId: nwa.userId, before: { status: 'submitted' }, after: { status: 'approved' } });
    // the history names who acted, not only their id
    const [who] = await t.dataSource.query('SELECT name FROM user_account WHERE id = ?', [nwa.userId]);
    expect(decision.actorName).toBe(who.name);
  });
});

describe('decisions', () => {
  it('allows only the transitions of the decision table', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const nwa = await networkAdmin(t.app);
    const decide = (decision: string, message = 'A reason') => request(t.app).post(`/api/admin/applications/${orgId}/decision`).set(bearer(nwa)).send({ decision, message });
    for (const decision of ['approve', 'request_changes', 'reject', 'suspend', 'reinstate']) {
      const res = await decide(decision).expect(409);
      expect(res.body.code).toBe('INVALID_TRANSITION');
    }
    await fillApplication(t.app, admin, orgId);
    await request(t.app).post(`/api/orgs/${orgId}/application/submit`).set(bearer(admin)).expect(200);
    await decide('reinstate').expect(409);
    await decide('suspend').expect(409);
    await decide('approve').expect(200);
    await decide('approve').expect(409);
    await decide('reject').expect(409);
    const suspended = await decide('suspend', 'Complaints about unfinished jobs').expect(200);
    expect(suspended.body.data.application).toMatchObject({ status: 'suspended', statusReason: 'Complaints about unfinished jobs' });
    expect((await mailsTo(admin.email, 'organisation-suspended'))[0]!.text_body).toContain('Complaints about unfinished jobs');
    const reinstated = await decide('reinstate', '').expect(200);
    expect(reinstated.body.data.application).toMatchObject({ status: 'approved', statusReason: null });
    expect(await mailsTo(admin.email, 'organisation-reinstated')).toHaveLength(1);
    const actions = await auditActions(orgId);
    expect(actions.filter((a) => a.startsWith('organisation.'))).toEqual(['organisation.create', 'organisation.suspend', 'organisation.reinstate']);
  });

  it('needs a message for changes, rejections and suspensions', async () => {
    const { orgId } = await partnerWithTeam(t.app, t.dataSource);
    const nwa = await networkAdmin(t.app);
    for (const decision of ['request_changes', 'reject', 'suspend']) {
      const res = await request(t.app).post(`/api/admin/applications/${orgId}/decision`).set(bearer(nwa)).send({ decision }).expect(400);
      expect(paths(res)).toEqual(['message']);
    }
    const unknown = await request(t.app).post(`/api/admin/applications/${orgId}/decision`).set(bearer(nwa)).send({ decision: 'promote' }).expect(400);
    expect(paths(unknown)).toEqual(['decision']);
  });

  it('rejects with the reason and e-mails the partner admins', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    await fillApplication(t.app, admin, orgId);
    await request(t.app).post(`/api/orgs/${orgId}/application/submit`).set(bearer(admin)).expect(200);
    const nwa = await networkAdmin(t.app);
    const res = await request(t.app).post(`/api/admin/applications/${orgId}/decision`).set(bearer(nwa)).send({ decision: 'reject', message: 'No flashing interface shown.' }).expect(200);
    expect(res.body.data.application).toMatchObject({ status: 'rejected', statusReason: 'No flashing interface shown.', editable: false });
    expect((await mailsTo(admin.email, 'application-rejected'))[0]!.text_body).toContain('No flashing interface shown.');
    await request(t.app).post(`/api/orgs/${orgId}/application/submit`).set(bearer(admin)).expect(409);
  });

  it('keeps the admin routes to network admins, and answers 404 for unknown organisations', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    await request(t.app).get('/api/admin/applications').set(bearer(admin)).expect(403);
    await request(t.app).get(`/api/admin/applications/${orgId}`).set(bearer(admin)).expect(403);
    await request(t.app).post(`/api/admin/applications/${orgId}/decision`).set(bearer(admin)).send({ decision: 'approve' }).expect(403);
    await request(t.app).get('/api/admin/applications').expect(401);
    const nwa = await networkAdmin(t.app);
    const missing = await request(t.app).get('/api/admin/applications/00000000-0000-4000-8000-000000000000').set(bearer(nwa)).expect(404);
    expect(missing.body.code).toBe('NOT_FOUND');
    await request(t.app).post('/api/admin/applications/00000000-0000-4000-8000-000000000000/decision').set(bearer(nwa)).send({ decision: 'approve' }).expect(404);
    const draft = await request(t.app).put(`/api/admin/applications/${orgId}/review`).set(bearer(nwa)).send({ checklist: { insuranceValid: true, insuranceCoversMobileWork: true, registrationMatches: true, equipmentEvidence: true, identityChecked: true }, internalNotes: '' }).expect(409);
    expect(draft.body.code).toBe('NOT_SUBMITTED');
  });
});

describe('the review queue', () => {
  it('filters by status, country and text and sorts by waiting time and name', async () => {
    const stamp = Date.now().toString(36);
    const a = await partnerWithTeam(t.app, t.dataSource);
    const b = await partnerWithTeam(t.app, t.dataSource);
    await fillApplication(t.app, a.admin, a.orgId, { business: { tradingName: `Queue ${stamp} Bravo` } });
    await fillApplication(t.app, b.admin, b.orgId, { business: { tradingName: `Queue ${stamp} Alpha`, country: 'DE', vatId: '' } });
    await request(t.app).post(`/api/orgs/${a.orgId}/application/submit`).set(bearer(a.admin)).expect(200);
    await request(t.app).post(`/api/orgs/${b.orgId}/application/submit`).set(bearer(b.admin)).expect(200);
    // A has waited three days longer
    await t.dataSource.query('UPDATE partner_profile SET submitted_at = submitted_at - INTERVAL 3 DAY WHERE organisation_id = ?', [a.orgId]);
    const nwa = await networkAdmin(t.app);
    const list = (query: object) => request(t.app).get('/api/admin/applications').query({ q: `Queue ${stamp}`, ...query }).set(bearer(nwa)).expect(200);
    const waiting = await list({});
    expect(waiting.body.data.map((s: { organisationId: string }) => s.organisationId)).toEqual([a.orgId, b.orgId]);
    expect(waiting.body.data[0]).toMatchObject({ waitingDays: 3, insuranceExpiresOn: isoDay(200) });
    expect((await list({ sort: 'waiting', order: 'asc' })).body.data.map((s: { organisationId: string }) => s.organisationId)).toEqual([b.orgId, a.orgId]);
    expect((await list({ sort: 'name' })).body.data.map((s: { tradingName: string }) => s.tradingName)).toEqual([`Queue ${stamp} Alpha`, `Queue ${stamp} Bravo`]);
    expect((await list({ country: 'DE' })).body.data.map((s: { organisationId: string }) => s.organisationId)).toEqual([b.orgId]);
    expect((await list({ status: 'approved' })).body.data).toEqual([]);
    const bad = await request(t.app).get('/api/admin/applications').query({ sort: 'size', status: 'lost' }).set(bearer(nwa)).expect(400);
    expect(paths(bad)).toEqual(['query.sort', 'query.status']);
  });
});

describe('the review queue, longest waiting first', () => {
  it('lists applications waiting for the network first (oldest first), then approved and suspended partners', async () => {
    const stamp = Date.now().toString(36);
    const orgs = [];
    for (const name of ['Old approved', 'Older suspended', 'Waiting new', 'Waiting older']) {
      const p = await partnerWithTeam(t.app, t.dataSource);
      await fillApplication(t.app, p.admin, p.orgId, { business: { tradingName: `Order ${stamp} ${name}` } });
      await request(t.app).post(`/api/orgs/${p.orgId}/application/submit`).set(bearer(p.admin)).expect(200);
      orgs.push(p.orgId);
    }
    const [approved, suspended, waitingNew, inReview] = orgs as [string, string, string, string];
    const age = (orgId: string, days: number, status: string) =>
      t.dataSource.query('UPDATE organisation o JOIN partner_profile p ON p.organisation_id = o.id SET o.status = ?, p.submitted_at = p.submitted_at - INTERVAL ? DAY WHERE o.id = ?', [status, days, orgId]);
    await age(approved, 40, 'approved');
    await age(suspended, 90, 'suspended');
    await age(waitingNew, 1, 'submitted');
    await age(inReview, 5, 'in_review');
    const nwa = await networkAdmin(t.app);
    const ids = async (query: object) =>
      (await request(t.app).get('/api/admin/applications').query({ q: `Order ${stamp}`, ...query }).set(bearer(nwa)).expect(200)).body.data.map((s: { organisationId: string }) => s.organisationId);
    expect(await ids({ sort: 'waiting' })).toEqual([inReview, waitingNew, suspended, approved]);
    // shortest wait first still keeps the waiting ones on top
    expect(await ids({ sort: 'waiting', order: 'asc' })).toEqual([waitingNew, inReview, approved, suspended]);
  });
});

describe('the capability catalogue', () => {
  it('lets network admins add, change, retire and restore capabilities, audited', async () => {
    const nwa = await networkAdmin(t.app);
    const code = `thermal-camera-${Date.now().toString(36)}`;
    const input = { code, name: 'Thermal camera', description: 'Finds hot spots on exhaust and coolant lines.', category: 'measurement', standards: [] };
    const created = await request(t.app).post('/api/admin/capabilities').set(bearer(nwa)).send(input).expect(201);
    expect(created.body.data).toEqual({ ...input, retired: false });
    const duplicate = await request(t.app).post('/api/admin/capabilities').set(bearer(nwa)).send(input).expect(409);
    expect(duplicate.body.code).toBe('CAPABILITY_EXISTS');
    const bad = await request(t.app).post('/api/admin/capabilities').set(bearer(nwa)).send({ ...input, code: 'Not A Code', category: 'magic' }).expect(400);
    expect(paths(bad)).toEqual(['category', 'code']);
    await request(t.app).patch(`/api/admin/capabilities/${code}`).set(bearer(nwa)).send({ name: 'Thermal imaging camera' }).expect(200);
    const retired = await request(t.app).patch(`/api/admin/capabilities/${code}`).set(bearer(nwa)).send({ retired: true }).expect(200);
    expect(retired.body.data).toMatchObject({ name: 'Thermal imaging camera', retired: true });
    // gone from the public catalogue, still in the admin one
    const publicList = await request(t.app).get('/api/catalogue/capabilities').expect(200);
    expect(publicList.body.data.map((c: { code: string }) => c.code)).not.toContain(code);
    const adminList = await request(t.app).get('/api/admin/capabilities').set(bearer(nwa)).expect(200);
    expect(adminList.body.data).toContainEqual(expect.objectContaining({ code, retired: true }));
    await request(t.app).patch(`/api/admin/capabilities/${code}`).set(bearer(nwa)).send({ retired: false }).expect(200);
    // retired again, so the shared test catalogue stays as seeded for other test files
    await request(t.app).patch(`/api/admin/capabilities/${code}`).set(bearer(nwa)).send({ retired: true }).expect(200);
    await request(t.app).patch('/api/admin/capabilities/no-such-capability').set(bearer(nwa)).send({ retired: true }).expect(404);
    const audit: { action: string; actor_user_id: string }[] = await t.dataSource.query('SELECT action, actor_user_id FROM audit_log WHERE entity_type = ? AND entity_id = ? ORDER BY id', ['capability', code]);
    expect(audit.map((a) => a.action)).toEqual(['capability.create', 'capability.update', 'capability.retire', 'capability.restore', 'capability.retire']);
    expect(new Set(audit.map((a) => a.actor_user_id))).toEqual(new Set([nwa.userId]));
  });

  it('is closed to partners', async () => {
    const { admin } = await partnerWithTeam(t.app, t.dataSource);
    await request(t.app).get('/api/admin/capabilities').set(bearer(admin)).expect(403);
    await request(t.app).post('/api/admin/capabilities').set(bearer(admin)).send({}).expect(403);
  });
});

describe('the demo network', () => {
  it('has Alpenglut Technik waiting in the queue with a complete application, and Brennpunkt suspended without valid insurance', async () => {
    const nwa = await networkAdmin(t.app);
    const queue = await request(t.app).get('/api/admin/applications').query({ status: 'submitted', q: 'Alpenglut' }).set(bearer(nwa)).expect(200);
    expect(queue.body.data).toEqual([expect.objectContaining({ tradingName: 'Alpenglut Technik', city: 'Graz', country: 'AT', status: 'submitted', waitingDays: 2 })]);
    const alpenglut = await request(t.app).get(`/api/admin/applications/${queue.body.data[0].organisationId}`).set(bearer(nwa)).expect(200);
    expect(alpenglut.body.data.application).toMatchObject({ missing: [], area: { baseLat: 47.0707, baseLng: 15.4395, mode: 'mobile', radiusKm: 60 } });
    expect(alpenglut.body.data.application.documents.map((d: { kind: string }) => d.kind).sort()).toEqual(['insurance', 'registration']);

    const [brennpunkt] = (await request(t.app).get('/api/admin/applications').query({ q: 'Brennpunkt' }).set(bearer(nwa)).expect(200)).body.data;
    expect(brennpunkt).toMatchObject({ status: 'suspended', city: 'Salzburg' });
    expect(brennpunkt.insuranceExpiresOn < isoDay(0)).toBe(true);
    const detail = await request(t.app).get(`/api/admin/applications/${brennpunkt.organisationId}`).set(bearer(nwa)).expect(200);
    expect(detail.body.data.application).toMatchObject({ statusReason: 'insurance expired', missing: [{ path: 'documents.insurance', message: expect.stringContaining('expired') }] });
  });

  it('serves the demo documents from the storage the seed wrote them to', async () => {
    // the global setup seeds the documents into var/<database>-uploads
    const seeded = await createTestApp({ UPLOADS_DIR: inject('db').uploadsDir });
    try {
      const nwa = await networkAdmin(seeded.app);
      const [glutwerk] = (await request(seeded.app).get('/api/admin/applications').query({ q: 'Glutwerk' }).set(bearer(nwa)).expect(200)).body.data;
      const detail = await request(seeded.app).get(`/api/admin/applications/${glutwerk.organisationId}`).set(bearer(nwa)).expect(200);
      expect(detail.body.data.application.capabilities.map((c: { code: string }) => c.code)).toEqual(expect.arrayContaining(['uds-flash-programming', 'vci-pass-thru', 'battery-support-unit']));
      const insurance = detail.body.data.application.documents.find((d: { kind: string }) => d.kind === 'insurance');
      expect(insurance.expiresOn > isoDay(0)).toBe(true);
      const file = await request(seeded.app)
        .get(`/api/orgs/${glutwerk.organisationId}/documents/${insurance.id}/file`)
        .set(bearer(nwa))
        .buffer(true)
        .parse((r, cb) => {
          const chunks: Buffer[] = [];
          r.on('data', (c: Buffer) => chunks.push(c));
          r.on('end', () => cb(null, Buffer.concat(chunks)));
        })
        .expect(200);
      expect(file.headers['content-type']).toBe('application/pdf');
      const text = (file.body as Buffer).toString('latin1');
      expect(text.startsWith('%PDF-1.4')).toBe(true);
      expect(text).toContain('Glutwerk Mobil Lena Hofer e.U.');
      expect(text.trimEnd().endsWith('%%EOF')).toBe(true);
    } finally {
      await seeded.close();
    }
  });
});

describe('helpers', () => {
  it('approvedPartner ends approved', async () => {
    const p = await approvedPartner(t.app, t.dataSource);
    const res = await request(t.app).get(`/api/orgs/${p.orgId}/application`).set(bearer(p.admin)).expect(200);
    expect(res.body.data.status).toBe('approved');
  });
});
