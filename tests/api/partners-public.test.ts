// The public partner list: only approved organisations, whatever state the others are in.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ORGANISATION_STATUSES, PublicPartnerSchema } from '@emberline/domain';
import { approvedPartnersQuery, listPublicPartners } from '../../apps/api/src/services/partners.service';
import { ANONYMOUS } from '../../apps/api/src/lib/context';
import { createTestApp, type TestApp } from '../setup/app';
import { partnerWithTeam } from '../setup/accounts';
import { approvedPartner, bearer, fillApplication, networkAdmin } from '../setup/onboarding';

let t: TestApp;
/** One organisation in each status, all with a complete profile and base on the map. */
const byStatus: Record<string, string> = {};

beforeAll(async () => {
  t = await createTestApp();
  const nwa = await networkAdmin(t.app);
  const decide = (orgId: string, decision: string, message = 'A reason') =>
    request(t.app).post(`/api/admin/applications/${orgId}/decision`).set(bearer(nwa)).send({ decision, message }).expect(200);
  const filled = async (status: string) => {
    const team = await partnerWithTeam(t.app, t.dataSource);
    await fillApplication(t.app, team.admin, team.orgId, { business: { tradingName: `Public probe ${status} ${Date.now().toString(36)}` } });
    byStatus[status] = team.orgId;
    return team;
  };
  await filled('draft');
  for (const status of ['submitted', 'in_review', 'changes_requested', 'rejected', 'approved', 'suspended']) {
    const team = await filled(status);
    await request(t.app).post(`/api/orgs/${team.orgId}/application/submit`).set(bearer(team.admin)).expect(200);
    if (status === 'in_review') {
      const checklist = { insuranceValid: true, insuranceCoversMobileWork: true, registrationMatches: true, equipmentEvidence: true, identityChecked: true };
      await request(t.app).put(`/api/admin/applications/${team.orgId}/review`).set(bearer(nwa)).send({ checklist, internalNotes: '' }).expect(200);
    }
    if (status === 'changes_requested') await decide(team.orgId, 'request_changes');
    if (status === 'rejected') await decide(team.orgId, 'reject');
    if (status === 'approved' || status === 'suspended') await decide(team.orgId, 'approve');
    if (status === 'suspended') await decide(team.orgId, 'suspend');
  }
}, 60_000);
afterAll(() => t.close());

describe('GET /api/partners', () => {
  it('lists approved partners only, for anyone, in the public shape', async () => {
    const statuses: { id: string; status: string }[] = await t.dataSource.query('SELECT id, status FROM organisation WHERE id IN (?)', [Object.values(byStatus)]);
    expect(Object.fromEntries(statuses.map((s) => [s.status, s.id]))).toEqual(byStatus);

    const res = await request(t.app).get('/api/partners').expect(200);
    const ids = res.body.data.map((p: { id: string }) => p.id);
    expect(ids).toContain(byStatus.approved);
    for (const status of ORGANISATION_STATUSES.filter((s) => s !== 'approved')) expect(ids, status).not.toContain(byStatus[status]);
    for (const partner of res.body.data) expect(PublicPartnerSchema.strict().parse(partner)).toEqual(partner);
    // nothing private leaks: no legal name, street, VAT ID, phone or documents
    const text = JSON.stringify(res.body);
    for (const secret of ['ATU77240638', 'Anichstraße', '+43 512', 'e.U.', 'insurance']) expect(text).not.toContain(secret);
  });

  it('drops a partner as soon as it is suspended and shows it again once reinstated', async () => {
    const p = await approvedPartner(t.app, t.dataSource);
    const listed = async () => (await request(t.app).get('/api/partners').expect(200)).body.data.map((x: { id: string }) => x.id) as string[];
    expect(await listed()).toContain(p.orgId);
    await request(t.app).post(`/api/admin/applications/${p.orgId}/decision`).set(bearer(p.networkAdmin)).send({ decision: 'suspend', message: 'Checking a complaint' }).expect(200);
    expect(await listed()).not.toContain(p.orgId);
    await request(t.app).post(`/api/admin/applications/${p.orgId}/decision`).set(bearer(p.networkAdmin)).send({ decision: 'reinstate' }).expect(200);
    expect(await listed()).toContain(p.orgId);
  });

  it('shows the demo network: the approved partners, not the pending or suspended ones', async () => {
    const res = await request(t.app).get('/api/partners').expect(200);
    const names = res.body.data.map((p: { tradingName: string }) => p.tradingName);
    for (const name of ['Glutwerk Mobil', 'Nordlys Varme', 'Kaltstart Service Bayern', 'Fjällvärme', 'Varmebil Sjælland']) expect(names).toContain(name);
    expect(names).not.toContain('Alpenglut Technik');
    expect(names).not.toContain('Brennpunkt Kfz-Elektrik');
    const varmebil = res.body.data.find((p: { tradingName: string }) => p.tradingName === 'Varmebil Sjælland');
    expect(varmebil).toMatchObject({ city: 'Roskilde', country: 'DK', mode: 'workshop', baseLat: 55.6415, baseLng: 12.0803 });
    expect(varmebil.capabilities).not.toContain('uds-flash-programming');
    expect(varmebil.capabilities).not.toContain('vci-pass-thru');
    expect(varmebil.capabilities).not.toContain('battery-support-unit');
  });
});

describe('approvedPartnersQuery', () => {
  it('enforces the approved status in SQL, even when callers add their own conditions', async () => {
    const qb = approvedPartnersQuery(t.dataSource.manager);
    expect(qb.getQuery()).toMatch(/WHERE `o`\.`status` = 'approved'/);
    const rows: { status: string }[] = await approvedPartnersQuery(t.dataSource.manager).select('o.status', 'status').andWhere('o.id IN (:...ids)', { ids: Object.values(byStatus) }).getRawMany();
    expect(rows).toEqual([{ status: 'approved' }]);
    const all = await listPublicPartners({ manager: t.dataSource.manager, actor: ANONYMOUS });
    const statuses: { status: string }[] = await t.dataSource.query('SELECT DISTINCT status FROM organisation WHERE id IN (?)', [all.map((p) => p.id)]);
    expect(statuses).toEqual([{ status: 'approved' }]);
  });
});
