// Network-admin routes for vetting partners and for the capability catalogue.
import { z } from 'zod';
import {
  ApplicationReviewSchema,
  ApplicationSummarySchema,
  CapabilityInputSchema,
  CapabilityPatchSchema,
  CapabilitySchema,
  CatalogueCodeSchema,
  CountrySchema,
  DecisionSchema,
  IdSchema,
  OrganisationStatusSchema,
  ReviewUpdateSchema,
} from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { reviewController } from '../controllers/review.controller';

const OrgParams = z.object({ orgId: IdSchema });
const ReviewResponse = z.object({ data: ApplicationReviewSchema });

export function registerReviewRoutes(api: ApiRouter, app: AppContext): void {
  const c = reviewController(app);
  const tags = ['Network admin'];
  const roles = ['network_admin' as const];
  api.route(
    {
      method: 'get',
      path: '/admin/applications',
      summary: 'Partner applications and organisations, for the review queue',
      tags,
      roles,
      query: z.object({
        status: OrganisationStatusSchema.optional(),
        country: CountrySchema.optional(),
        q: z.string().trim().max(120).optional(),
        sort: z.enum(['waiting', 'name', 'submitted']).default('waiting'),
        order: z.enum(['asc', 'desc']).optional(),
      }),
      response: z.object({ data: z.array(ApplicationSummarySchema) }),
    },
    c.list,
  );
  api.route(
    {
      method: 'get',
      path: '/admin/applications/:orgId',
      summary: 'One application with the review checklist, internal notes and history',
      tags,
      roles,
      params: OrgParams,
      response: ReviewResponse,
      problems: [404],
    },
    c.get,
  );
  api.route(
    {
      method: 'put',
      path: '/admin/applications/:orgId/review',
      summary: 'Save the review checklist and internal notes (a submitted application moves to in review)',
      tags,
      roles,
      params: OrgParams,
      body: ReviewUpdateSchema,
      response: ReviewResponse,
      problems: [404, 409],
    },
    c.saveReview,
  );
  api.route(
    {
      method: 'post',
      path: '/admin/applications/:orgId/decision',
      summary: 'Approve, request changes, reject, suspend or reinstate',
      description: 'Only the transitions of DECISION_TRANSITIONS are possible (else 409 INVALID_TRANSITION). The partner admins are told by e-mail.',
      tags,
      roles,
      params: OrgParams,
      body: DecisionSchema,
      response: ReviewResponse,
      problems: [404, 409],
    },
    c.decide,
  );
  api.route(
    {
      method: 'get',
      path: '/admin/capabilities',
      summary: 'The whole capability catalogue, retired entries included',
      tags,
      roles,
      response: z.object({ data: z.array(CapabilitySchema) }),
    },
    c.listCapabilities,
  );
  api.route(
    {
      method: 'post',
      path: '/admin/capabilities',
      summary: 'Add a capability to the catalogue',
      tags,
      roles,
      body: CapabilityInputSchema,
      response: z.object({ data: CapabilitySchema }),
      status: 201,
      problems: [409],
    },
    c.createCapability,
  );
  api.route(
    {
      method: 'patch',
      path: '/admin/capabilities/:code',
      summary: 'Change, retire or restore a capability',
      tags,
      roles,
      params: z.object({ code: CatalogueCodeSchema }),
      body: CapabilityPatchSchema,
      response: z.object({ data: CapabilitySchema }),
      problems: [404],
    },
    c.updateCapability,
  );
}
