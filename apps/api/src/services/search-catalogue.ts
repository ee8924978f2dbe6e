// What every search reads first and that seldom changes: the service types with the capabilities
// they require, the capability names, and the active vehicle rules. Kept in memory for
// SEARCH_CATALOGUE_TTL_MS and dropped at once when this instance changes a rule or a capability;
// another instance's change reaches this one within the TTL.
import type { EntityManager } from 'typeorm';
import type { CautionCode } from '@emberline/domain';
import { activeRules, type EligibilityRuleView } from './eligibility-rules.service';
import { json } from '../lib/json-column';

export const SEARCH_CATALOGUE_TTL_MS = 30_000;

export interface SearchServiceType {
  id: number;
  code: string;
  name: string;
  defaultDurationMinutes: number;
  cautions: CautionCode[];
  retired: boolean;
  requiredCapabilities: string[];
}

export interface SearchCatalogue {
  serviceTypes: Map<string, SearchServiceType>;
  capabilities: Map<string, { id: number; code: string; name: string }>;
  rules: EligibilityRuleView[];
}

let cached: { expires: number; catalogue: Promise<SearchCatalogue> } | null = null;

async function load(manager: EntityManager): Promise<SearchCatalogue> {
  const [types, capabilities, rules] = await Promise.all([
    manager.query(
      `SELECT st.id, st.code, st.name, st.default_duration_minutes, st.cautions, st.retired, c.code AS capability_code
       FROM service_type st LEFT JOIN service_type_capability stc ON stc.service_type_id = st.id LEFT JOIN capability c ON c.id = stc.capability_id
       ORDER BY st.code, c.code`,
    ) as Promise<{ id: number; code: string; name: string; default_duration_minutes: number; cautions: unknown; retired: number; capability_code: string | null }[]>,
    manager.query('SELECT id, code, name FROM capability') as Promise<{ id: number; code: string; name: string }[]>,
    activeRules(manager),
  ]);
  const serviceTypes = new Map<string, SearchServiceType>();
  for (const r of types) {
    let st = serviceTypes.get(r.code);
    if (!st) {
      st = { id: Number(r.id), code: r.code, name: r.name, defaultDurationMinutes: Number(r.default_duration_minutes), cautions: json<CautionCode[]>(r.cautions), retired: Boolean(Number(r.retired)), requiredCapabilities: [] };
      serviceTypes.set(r.code, st);
    }
    if (r.capability_code) st.requiredCapabilities.push(r.capability_code);
  }
  return { serviceTypes, capabilities: new Map(capabilities.map((c) => [c.code, { id: Number(c.id), code: c.code, name: c.name }])), rules };
}

/** The catalogue as the search needs it, from memory when fresh (three queries side by side when not). */
export function searchCatalogue(manager: EntityManager, now = Date.now()): Promise<SearchCatalogue> {
  if (!cached || cached.expires <= now) {
    const catalogue = load(manager);
    cached = { expires: now + SEARCH_CATALOGUE_TTL_MS, catalogue };
    // a failed read is not kept
    catalogue.catch(() => {
      if (cached?.catalogue === catalogue) cached = null;
    });
  }
  return cached.catalogue;
}

/** Call after changing a rule, a capability or a service type, so the next search reads them again. */
export function forgetSearchCatalogue(): void {
  cached = null;
}
