// A partner's application and documents under /orgs/:orgId: partner admins edit, the whole team
// and network admins read.
import { z } from 'zod';
import {
  ApplicationSchema,
  AreaStepSchema,
  BusinessStepSchema,
  CapabilitiesStepSchema,
  DocumentSchema,
  IdSchema,
  UPLOAD_LIMIT_BYTES,
  UPLOAD_TYPES,
  documentFieldsSchema,
} from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { onboardingController } from '../controllers/onboarding.controller';
import { todayUtc } from '../services/onboarding.service';

const OrgParams = z.object({ orgId: IdSchema });
const DocumentParams = OrgParams.extend({ documentId: IdSchema });
const ApplicationResponse = z.object({ data: ApplicationSchema });

export function registerOnboardingRoutes(api: ApiRouter, app: AppContext): void {
  const c = onboardingController(app);
  const tags = ['Partner onboarding'];
  const readers = ['partner_admin', 'technician', 'network_admin'] as const;
  const step = (path: string, summary: string) => ({
    method: 'put' as const,
    path: `/orgs/:orgId/application/${path}`,
    summary,
    description: 'Saves one step of a draft. Only while the application is a draft or changes were requested (else 409 NOT_EDITABLE).',
    tags,
    org: true,
    roles: ['partner_admin' as const],
    params: OrgParams,
    response: ApplicationResponse,
    problems: [409],
  });

  api.route(
    {
      method: 'get',
      path: '/orgs/:orgId/application',
      summary: 'The application: steps, documents, change request and what is still missing',
      tags,
      org: true,
      roles: [...readers],
      params: OrgParams,
      response: ApplicationResponse,
    },
    c.getApplication,
  );
  api.route({ ...step('business', 'Save the business details step'), body: BusinessStepSchema }, c.saveBusiness);
  api.route({ ...step('area', 'Save the service area step'), body: AreaStepSchema }, c.saveArea);
  api.route({ ...step('capabilities', 'Save the equipment and skills step'), body: CapabilitiesStepSchema }, c.saveCapabilities);
  api.route(
    {
      method: 'post',
      path: '/orgs/:orgId/application/submit',
      summary: 'Submit the application for review',
      description: 'Refused with 400 VALIDATION_FAILED listing everything still missing (e.g. `business`, `area.radiusKm`, `documents.insurance`).',
      tags,
      org: true,
      roles: ['partner_admin'],
      params: OrgParams,
      response: ApplicationResponse,
      problems: [409],
    },
    c.submit,
  );
  api.route(
    {
      method: 'post',
      path: '/orgs/:orgId/documents',
      summary: 'Upload a document (insurance, registration, qualification or equipment photo)',
      description: `multipart/form-data with one \`file\` (PDF, JPEG, PNG or WebP, recognised from its content; at most ${UPLOAD_LIMIT_BYTES / (1024 * 1024)} MB) and the fields \`kind\`, \`expiresOn\` (insurance) and \`capabilityCode\` (evidence).`,
      tags,
      org: true,
      roles: ['partner_admin'],
      params: OrgParams,
      body: () => documentFieldsSchema(todayUtc()),
      multipart: { fileField: 'file', maxBytes: UPLOAD_LIMIT_BYTES },
      response: z.object({ data: DocumentSchema }),
      status: 201,
      problems: [409, 415],
    },
    c.upload,
  );
  api.route(
    {
      method: 'get',
      path: '/orgs/:orgId/documents/:documentId/file',
      summary: 'The file of a document, shown inline',
      tags,
      org: true,
      params: DocumentParams,
      produces: UPLOAD_TYPES,
    },
    c.downloadFile,
  );
  api.route(
    {
      method: 'delete',
      path: '/orgs/:orgId/documents/:documentId',
      summary: 'Delete a document of a draft application',
      tags,
      org: true,
      roles: ['partner_admin'],
      params: DocumentParams,
      response: z.object({ data: z.object({ deleted: z.literal(true) }) }),
      problems: [409],
    },
    c.deleteDocument,
  );
}
