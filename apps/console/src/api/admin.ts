// Network-admin logs: outgoing e-mail and the audit trail.
import * as client from '@emberline/api-client';
import type { AuditEntry, MailLogEntry } from '@emberline/domain';
import { http } from './http';

export function listMailLog(query: client.MailLogQuery = {}, signal?: AbortSignal): Promise<MailLogEntry[]> {
  return client.listMailLog(http, query, signal);
}

export function listAuditLog(query: { organisationId?: string; limit?: number } = {}, signal?: AbortSignal): Promise<AuditEntry[]> {
  return client.listAuditLog(http, query, signal);
}
