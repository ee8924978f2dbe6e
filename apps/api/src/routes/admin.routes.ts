// Network-admin routes.
import { z } from 'zod';
import { AuditEntrySchema, IdSchema, MAIL_STATUSES, MailLogEntrySchema, queryNumber } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { adminController } from '../controllers/admin.controller';

export function registerAdminRoutes(api: ApiRouter, app: AppContext): void {
  const c = adminController(app);
  const tags = ['Network admin'];
  api.route(
    {
      method: 'get',
      path: '/admin/mail-log',
      summary: 'E-mails sent, waiting or given up on',
      tags,
      roles: ['network_admin'],
      query: z.object({
        status: z.enum(MAIL_STATUSES).optional(),
        to: z.string().max(254).optional(),
        limit: queryNumber(z.number().int().min(1).max(500)).default(100),
      }),
      response: z.object({ data: z.array(MailLogEntrySchema) }),
    },
    c.listMail,
  );
  api.route(
    {
      method: 'get',
      path: '/admin/audit-log',
      summary: 'Who did what, when, with before and after',
      tags,
      roles: ['network_admin'],
      query: z.object({ organisationId: IdSchema.optional(), limit: queryNumber(z.number().int().min(1).max(500)).default(100) }),
      response: z.object({ data: z.array(AuditEntrySchema) }),
    },
    c.listAudit,
  );
}
