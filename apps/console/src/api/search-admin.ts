// Network-admin views of the Directory's search: unmet demand and the vehicle rules.
import * as client from '@emberline/api-client';
import type { CoverageGaps, EligibilityRuleInput } from '@emberline/domain';
import { http } from './http';

export function getCoverageGaps(q: { days?: number; serviceType?: string }, signal?: AbortSignal): Promise<CoverageGaps> {
  return client.getCoverageGaps(http, q, signal);
}

export function listEligibilityRules(signal?: AbortSignal): Promise<client.EligibilityRuleView[]> {
  return client.listEligibilityRules(http, signal);
}

export function createEligibilityRule(body: EligibilityRuleInput): Promise<client.EligibilityRuleView> {
  return client.createEligibilityRule(http, body);
}

export function updateEligibilityRule(code: string, body: EligibilityRuleInput): Promise<client.EligibilityRuleView> {
  return client.updateEligibilityRule(http, code, body);
}

export function deleteEligibilityRule(code: string): Promise<void> {
  return client.deleteEligibilityRule(http, code);
}
