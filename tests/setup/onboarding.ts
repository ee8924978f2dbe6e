// Helpers for onboarding tests: fill in an application through the real endpoints, and take an
// organisation through review to approval as a network admin would.
import request from 'supertest';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { expect } from 'vitest';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { partnerWithTeam, signIn, type SignedIn } from './accounts';
import { isoDay, pdfBytes } from './files';

export const bearer = (who: { accessToken: string }) => ({ authorization: `Bearer ${who.accessToken}` });

export const BUSINESS = {
  legalName: 'Glimmspur Heiztechnik e.U.',
  tradingName: 'Glimmspur Heiztechnik',
  country: 'AT',
  street: 'Anichstraße 12',
  postalCode: '6020',
  city: 'Innsbruck',
  vatId: 'ATU77240638',
  phone: '+43 512 123456',
};
export const AREA = { baseLabel: 'Innsbruck', baseLat: 47.2692, baseLng: 11.4041, mode: 'mobile', radiusKm: 80, workshopAddress: null };
export const CAPABILITIES = { capabilities: [{ code: 'vci-pass-thru', serial: 'VCI-0042' }, { code: 'battery-support-unit' }, { code: 'digital-multimeter', notes: 'with current clamp' }] };

/** The network admin of the demo seed. */
export const networkAdmin = (app: Express) => signIn(app, 'admin@emberline.example', DEMO_PASSWORD);

export function upload(app: Express, who: SignedIn, orgId: string, fields: Record<string, string>, file: { bytes: Buffer; name: string; type?: string }) {
  let req = request(app).post(`/api/orgs/${orgId}/documents`).set(bearer(who));
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', file.bytes, { filename: file.name, contentType: file.type ?? 'application/pdf' });
}

/** Saves every step and uploads insurance and registration, as the partner admin. */
export async function fillApplication(app: Express, who: SignedIn, orgId: string, o: { business?: object; area?: object; insuranceDays?: number; capabilities?: typeof CAPABILITIES } = {}) {
  await request(app).put(`/api/orgs/${orgId}/application/business`).set(bearer(who)).send({ ...BUSINESS, ...o.business }).expect(200);
  await request(app).put(`/api/orgs/${orgId}/application/area`).set(bearer(who)).send({ ...AREA, ...o.area }).expect(200);
  await request(app).put(`/api/orgs/${orgId}/application/capabilities`).set(bearer(who)).send(o.capabilities ?? CAPABILITIES).expect(200);
  const insurance = await upload(app, who, orgId, { kind: 'insurance', expiresOn: isoDay(o.insuranceDays ?? 200) }, { bytes: pdfBytes('Liability insurance', orgId), name: 'insurance.pdf' });
  expect(insurance.status, JSON.stringify(insurance.body)).toBe(201);
  const registration = await upload(app, who, orgId, { kind: 'registration' }, { bytes: pdfBytes('Business registration', orgId), name: 'registration.pdf' });
  expect(registration.status, JSON.stringify(registration.body)).toBe(201);
  return { insuranceId: insurance.body.data.id as string, registrationId: registration.body.data.id as string };
}

/** A new partner organisation taken through submit and approval. */
export async function approvedPartner(app: Express, ds: DataSource, o: { business?: object; area?: object; insuranceDays?: number; technician?: boolean; capabilities?: typeof CAPABILITIES } = {}) {
  const team = await partnerWithTeam(app, ds, { technician: o.technician });
  const docs = await fillApplication(app, team.admin, team.orgId, o);
  await request(app).post(`/api/orgs/${team.orgId}/application/submit`).set(bearer(team.admin)).expect(200);
  const admin = await networkAdmin(app);
  await request(app).post(`/api/admin/applications/${team.orgId}/decision`).set(bearer(admin)).send({ decision: 'approve' }).expect(200);
  return { ...team, ...docs, networkAdmin: admin };
}
