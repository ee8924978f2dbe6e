// Document uploads and downloads: the type is sniffed from the bytes, size and fields are
// checked, a failed upload leaves nothing behind, and files go only to their organisation.
import { readdirSync } from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { UPLOAD_LIMIT_BYTES } from '@emberline/domain';
import { createTestApp, type TestApp } from '../setup/app';
import { partnerWithTeam } from '../setup/accounts';
import { ELF_BYTES, isoDay, MZ_BYTES, pdfBytes, PNG_BYTES } from '../setup/files';
import { approvedPartner, bearer, fillApplication, networkAdmin, upload } from '../setup/onboarding';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const storedFiles = (): string[] => readdirSync(t.uploadsDir, { recursive: true, withFileTypes: true }).filter((e) => e.isFile()).map((e) => path.join(e.parentPath, e.name));
const documentRows = async (orgId: string): Promise<{ id: string; storage_key: string; deleted_at: Date | null }[]> =>
  t.dataSource.query('SELECT id, storage_key, deleted_at FROM partner_document WHERE organisation_id = ?', [orgId]);
const paths = (res: request.Response) => (res.body.errors as { path: string }[]).map((e) => e.path).sort();

describe('what an upload must be', () => {
  it('stores a real PDF and PNG with the type read from their content', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const filesBefore = storedFiles().length;
    const bytes = pdfBytes('Registration extract', orgId);
    // the client claims a wrong type and name: the content decides
    const pdf = await upload(t.app, admin, orgId, { kind: 'registration' }, { bytes, name: 'extract.png', type: 'image/png' }).expect(201);
    expect(pdf.body.data).toMatchObject({ kind: 'registration', contentType: 'application/pdf', fileName: 'extract.pdf', sizeBytes: bytes.length, expiresOn: null });
    const png = await upload(t.app, admin, orgId, { kind: 'qualification' }, { bytes: PNG_BYTES, name: 'certificate.png', type: 'application/octet-stream' }).expect(201);
    expect(png.body.data.contentType).toBe('image/png');
    expect(storedFiles()).toHaveLength(filesBefore + 2);
    const rows = await documentRows(orgId);
    expect(rows).toHaveLength(2);
    const [row] = await t.dataSource.query('SELECT sha256, size_bytes, uploaded_by, storage_key FROM partner_document WHERE id = ?', [pdf.body.data.id]);
    expect(row).toMatchObject({ size_bytes: bytes.length, uploaded_by: admin.userId });
    expect(row.sha256).toMatch(/^[0-9a-f]{64}$/);
    // stored under a random key, not the uploader's name
    expect(row.storage_key).toMatch(/^[0-9a-f-]{36}$/);
    expect(storedFiles().some((f) => f.endsWith(row.storage_key))).toBe(true);
  });

  it.each([
    ['a Linux executable renamed to .pdf', ELF_BYTES],
    ['a Windows executable renamed to .pdf', MZ_BYTES],
    ['plain text renamed to .pdf', Buffer.from('this is not a certificate\n'.repeat(20))],
  ])('refuses %s with 415 and keeps nothing', async (_label, bytes) => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const filesBefore = storedFiles().length;
    const res = await upload(t.app, admin, orgId, { kind: 'insurance', expiresOn: isoDay(100) }, { bytes, name: 'insurance.pdf', type: 'application/pdf' }).expect(415);
    expect(res.headers['content-type']).toContain('application/problem+json');
    expect(res.body).toMatchObject({ status: 415, code: 'UNSUPPORTED_MEDIA_TYPE' });
    expect(storedFiles()).toHaveLength(filesBefore);
    expect(await documentRows(orgId)).toEqual([]);
  });

  it('refuses a file over 10 MB with 413 problem details and keeps nothing', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const filesBefore = storedFiles().length;
    const big = Buffer.concat([pdfBytes(), Buffer.alloc(UPLOAD_LIMIT_BYTES + 1 - pdfBytes().length, 0x20)]);
    expect(big.length).toBe(UPLOAD_LIMIT_BYTES + 1);
    const res = await upload(t.app, admin, orgId, { kind: 'registration' }, { bytes: big, name: 'huge.pdf' }).expect(413);
    expect(res.headers['content-type']).toContain('application/problem+json');
    expect(res.body).toMatchObject({ status: 413, code: 'PAYLOAD_TOO_LARGE' });
    expect(storedFiles()).toHaveLength(filesBefore);
    expect(await documentRows(orgId)).toEqual([]);
    // exactly at the limit is fine
    const fits = Buffer.concat([pdfBytes(), Buffer.alloc(UPLOAD_LIMIT_BYTES - pdfBytes().length, 0x20)]);
    await upload(t.app, admin, orgId, { kind: 'registration' }, { bytes: fits, name: 'fits.pdf' }).expect(201);
  });

  it('checks the fields with field errors', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const file = { bytes: pdfBytes(), name: 'x.pdf' };
    const past = await upload(t.app, admin, orgId, { kind: 'insurance', expiresOn: isoDay(-1) }, file).expect(400);
    expect(past.body.code).toBe('VALIDATION_FAILED');
    expect(past.body.errors).toEqual([{ path: 'expiresOn', message: 'The expiry date must be in the future' }]);
    expect(paths(await upload(t.app, admin, orgId, { kind: 'insurance', expiresOn: isoDay(0) }, file).expect(400))).toEqual(['expiresOn']);
    expect(paths(await upload(t.app, admin, orgId, { kind: 'insurance' }, file).expect(400))).toEqual(['expiresOn']);
    // a certificate "valid until 31 Dec 9999" is a typing slip, not insurance: at most 10 years ahead
    const farFuture = await upload(t.app, admin, orgId, { kind: 'insurance', expiresOn: '9999-12-31' }, file).expect(400);
    expect(farFuture.body.errors).toEqual([{ path: 'expiresOn', message: expect.stringContaining('at most 10 years ahead') }]);
    expect(paths(await upload(t.app, admin, orgId, { kind: 'insurance', expiresOn: '31.12.2030' }, file).expect(400))).toEqual(['expiresOn']);
    expect(paths(await upload(t.app, admin, orgId, { kind: 'evidence' }, file).expect(400))).toEqual(['capabilityCode']);
    expect(paths(await upload(t.app, admin, orgId, { kind: 'evidence', capabilityCode: 'no-such-kit' }, file).expect(400))).toEqual(['capabilityCode']);
    expect(paths(await upload(t.app, admin, orgId, { kind: 'passport' }, file).expect(400))).toEqual(['kind']);
    const noFile = await request(t.app).post(`/api/orgs/${orgId}/documents`).set(bearer(admin)).field('kind', 'registration').expect(400);
    expect(paths(noFile)).toEqual(['file']);
    // JSON is not a format the upload reads: 415 rather than a body silently taken as empty
    const json = await request(t.app).post(`/api/orgs/${orgId}/documents`).set(bearer(admin)).send({ kind: 'registration' }).expect(415);
    expect(json.body.code).toBe('UNSUPPORTED_MEDIA_TYPE');
    const wrongField = await request(t.app).post(`/api/orgs/${orgId}/documents`).set(bearer(admin)).field('kind', 'registration').attach('upload', pdfBytes(), 'x.pdf').expect(400);
    expect(paths(wrongField)).toEqual(['file']);
    expect(await documentRows(orgId)).toEqual([]);
  });

  it('sanitises the file name it shows and sends back', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const traversal = await upload(t.app, admin, orgId, { kind: 'registration' }, { bytes: pdfBytes(), name: '../../etc/"evil";.pdf' }).expect(201);
    expect(traversal.body.data.fileName).toBe('evil.pdf');
    const umlaut = await upload(t.app, admin, orgId, { kind: 'registration' }, { bytes: pdfBytes(), name: 'Gewerbeauszug Übersicht.pdf' }).expect(201);
    expect(umlaut.body.data.fileName).toBe('Gewerbeauszug Übersicht.pdf');
    const file = await request(t.app).get(`/api/orgs/${orgId}/documents/${umlaut.body.data.id}/file`).set(bearer(admin)).expect(200);
    expect(file.headers['content-disposition']).toBe(`inline; filename="Gewerbeauszug _bersicht.pdf"; filename*=UTF-8''Gewerbeauszug%20%C3%9Cbersicht.pdf`);
  });
});

describe('nothing half-saved', () => {
  it('removes the stored file when the database refuses the row', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const filesBefore = storedFiles().length;
    // a fault injected into the database: inserts for this organisation fail after the file is stored
    await t.dataSource.query('DROP TRIGGER IF EXISTS test_refuse_document');
    await t.dataSource.query(
      `CREATE TRIGGER test_refuse_document BEFORE INSERT ON partner_document FOR EACH ROW
       BEGIN IF NEW.organisation_id = '${orgId}' THEN SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'injected failure'; END IF; END`,
    );
    try {
      const res = await upload(t.app, admin, orgId, { kind: 'registration' }, { bytes: pdfBytes(), name: 'r.pdf' }).expect(500);
      expect(res.body.code).toBe('INTERNAL');
      expect(JSON.stringify(res.body)).not.toContain('injected failure');
    } finally {
      await t.dataSource.query('DROP TRIGGER IF EXISTS test_refuse_document');
    }
    expect(storedFiles()).toHaveLength(filesBefore);
    expect(await documentRows(orgId)).toEqual([]);
    const audit = await t.dataSource.query("SELECT COUNT(*) AS n FROM audit_log WHERE organisation_id = ? AND action = 'document.upload'", [orgId]);
    expect(Number(audit[0].n)).toBe(0);
  });

  it('keeps no file when the application cannot take documents now', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    await fillApplication(t.app, admin, orgId);
    await request(t.app).post(`/api/orgs/${orgId}/application/submit`).set(bearer(admin)).expect(200);
    const filesBefore = storedFiles().length;
    const rowsBefore = (await documentRows(orgId)).length;
    const res = await upload(t.app, admin, orgId, { kind: 'registration' }, { bytes: pdfBytes(), name: 'late.pdf' }).expect(409);
    expect(res.body.code).toBe('NOT_EDITABLE');
    expect(storedFiles()).toHaveLength(filesBefore);
    expect(await documentRows(orgId)).toHaveLength(rowsBefore);
  });
});

describe('downloads', () => {
  it('streams the file inline, with its type and nosniff, to members and network admins', async () => {
    const { admin, orgId, technician } = await partnerWithTeam(t.app, t.dataSource, { technician: true });
    const bytes = pdfBytes('Insurance certificate', orgId);
    const doc = await upload(t.app, admin, orgId, { kind: 'insurance', expiresOn: isoDay(90) }, { bytes, name: 'Insurance 2026.pdf' }).expect(201);
    const nwa = await networkAdmin(t.app);
    for (const who of [admin, technician!, nwa]) {
      const res = await request(t.app).get(`/api/orgs/${orgId}/documents/${doc.body.data.id}/file`).set(bearer(who)).buffer(true).parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      }).expect(200);
      expect(res.headers['content-type']).toBe('application/pdf');
      expect(res.headers['content-disposition']).toBe(`inline; filename="Insurance 2026.pdf"; filename*=UTF-8''Insurance%202026.pdf`);
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['cache-control']).toBe('private, no-store');
      expect(Buffer.compare(res.body as Buffer, bytes)).toBe(0);
    }
  });

  it('answers 404 for another organisation\'s document, whichever way it is asked for', async () => {
    const a = await partnerWithTeam(t.app, t.dataSource);
    const b = await partnerWithTeam(t.app, t.dataSource);
    const doc = await upload(t.app, b.admin, b.orgId, { kind: 'registration' }, { bytes: pdfBytes('B only'), name: 'b.pdf' }).expect(201);
    const underOwn = await request(t.app).get(`/api/orgs/${a.orgId}/documents/${doc.body.data.id}/file`).set(bearer(a.admin)).expect(404);
    expect(underOwn.body.code).toBe('NOT_FOUND');
    expect(underOwn.text).not.toContain('B only');
    await request(t.app).get(`/api/orgs/${b.orgId}/documents/${doc.body.data.id}/file`).set(bearer(a.admin)).expect(404);
    await request(t.app).delete(`/api/orgs/${a.orgId}/documents/${doc.body.data.id}`).set(bearer(a.admin)).expect(404);
    await request(t.app).get(`/api/orgs/${b.orgId}/documents/${doc.body.data.id}/file`).expect(401);
    expect((await documentRows(b.orgId))[0]!.deleted_at).toBeNull();
  });
});

describe('deleting documents', () => {
  it('deletes a draft\'s document and its file, audited; not once submitted', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const extra = await upload(t.app, admin, orgId, { kind: 'qualification' }, { bytes: PNG_BYTES, name: 'q.png', type: 'image/png' }).expect(201);
    const [row] = await documentRows(orgId);
    expect(storedFiles().some((f) => f.endsWith(row!.storage_key))).toBe(true);
    await request(t.app).delete(`/api/orgs/${orgId}/documents/${extra.body.data.id}`).set(bearer(admin)).expect(200);
    expect(storedFiles().some((f) => f.endsWith(row!.storage_key))).toBe(false);
    await request(t.app).get(`/api/orgs/${orgId}/documents/${extra.body.data.id}/file`).set(bearer(admin)).expect(404);
    const app = await request(t.app).get(`/api/orgs/${orgId}/application`).set(bearer(admin)).expect(200);
    expect(app.body.data.documents).toEqual([]);
    const audit = await t.dataSource.query("SELECT before_state FROM audit_log WHERE organisation_id = ? AND action = 'document.delete'", [orgId]);
    expect(audit).toHaveLength(1);

    const docs = await fillApplication(t.app, admin, orgId);
    await request(t.app).post(`/api/orgs/${orgId}/application/submit`).set(bearer(admin)).expect(200);
    const refused = await request(t.app).delete(`/api/orgs/${orgId}/documents/${docs.registrationId}`).set(bearer(admin)).expect(409);
    expect(refused.body.code).toBe('NOT_EDITABLE');
  });
});

describe('renewing insurance', () => {
  it('sends an approved partner with a new certificate back to review', async () => {
    const p = await approvedPartner(t.app, t.dataSource);
    // other documents stay locked while approved
    await upload(t.app, p.admin, p.orgId, { kind: 'registration' }, { bytes: pdfBytes(), name: 'r.pdf' }).expect(409);
    await upload(t.app, p.admin, p.orgId, { kind: 'insurance', expiresOn: isoDay(500) }, { bytes: pdfBytes('Renewed'), name: 'renewed.pdf' }).expect(201);
    const app = await request(t.app).get(`/api/orgs/${p.orgId}/application`).set(bearer(p.admin)).expect(200);
    expect(app.body.data.status).toBe('submitted');
    const [audit] = await t.dataSource.query("SELECT actor_user_id, before_state, after_state FROM audit_log WHERE organisation_id = ? AND action = 'application.resubmit-insurance'", [p.orgId]);
    expect(audit.actor_user_id).toBe(p.admin.userId);
    expect(audit.before_state).toMatchObject({ status: 'approved' });
    expect(audit.after_state).toMatchObject({ status: 'submitted' });
  });

  it('sends a partner suspended for expired insurance back to review, but not one suspended for another reason', async () => {
    const p = await approvedPartner(t.app, t.dataSource);
    await t.dataSource.query("UPDATE organisation SET status = 'suspended', status_reason = 'insurance expired' WHERE id = ?", [p.orgId]);
    await upload(t.app, p.admin, p.orgId, { kind: 'insurance', expiresOn: isoDay(365) }, { bytes: pdfBytes(), name: 'new.pdf' }).expect(201);
    const [org] = await t.dataSource.query('SELECT status, status_reason FROM organisation WHERE id = ?', [p.orgId]);
    expect(org).toEqual({ status: 'submitted', status_reason: null });

    const other = await approvedPartner(t.app, t.dataSource);
    await request(t.app).post(`/api/admin/applications/${other.orgId}/decision`).set(bearer(other.networkAdmin)).send({ decision: 'suspend', message: 'Unpaid fees' }).expect(200);
    await upload(t.app, other.admin, other.orgId, { kind: 'insurance', expiresOn: isoDay(365) }, { bytes: pdfBytes(), name: 'new.pdf' }).expect(409);
  });
});
