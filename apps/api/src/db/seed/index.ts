// Seeds what every environment needs and the invented demo scenario. Idempotent: running it
// twice adds nothing twice.
import type { EntityManager } from 'typeorm';
import type { SeedDemoMode } from '../../config';
import { DEFAULT_PASSWORD_HASH_COST } from '../../lib/password-hash';
import type { Storage } from '../../storage';
import { CapabilityEntity, ServiceTypeEntity } from '../../entities';
import { seedRules } from '../../services/eligibility-rules.service';
import { CAPABILITIES, SERVICE_TYPES } from './catalogue-data';
import { ELIGIBILITY_RULES } from './eligibility-rules';
import { seedDemo, type DemoSeedReport } from './demo';

export interface SeedReport {
  capabilitiesAdded: number;
  serviceTypesAdded: number;
  /** Starting vehicle rules whose codes were new (admins' edits and deletions are kept). */
  eligibilityRulesAdded: number;
}

export async function seedCatalogue(manager: EntityManager): Promise<SeedReport> {
  const capabilities = manager.getRepository(CapabilityEntity);
  const serviceTypes = manager.getRepository(ServiceTypeEntity);
  const report: SeedReport = { capabilitiesAdded: 0, serviceTypesAdded: 0, eligibilityRulesAdded: 0 };

  const existing = new Map((await capabilities.find()).map((c) => [c.code, c]));
  for (const seed of CAPABILITIES) {
    if (existing.has(seed.code)) continue;
    existing.set(seed.code, await capabilities.save(capabilities.create({ ...seed, retired: false })));
    report.capabilitiesAdded++;
  }

  const existingTypes = new Set((await serviceTypes.find({ select: { code: true } })).map((s) => s.code));
  for (const [index, seed] of SERVICE_TYPES.entries()) {
    if (existingTypes.has(seed.code)) continue;
    const required = seed.requiredCapabilities.map((code) => {
      const capability = existing.get(code);
      if (!capability) throw new Error(`Seed: service type ${seed.code} requires unknown capability ${code}`);
      return capability;
    });
    const { requiredCapabilities: _codes, ...fields } = seed;
    await serviceTypes.save(serviceTypes.create({ ...fields, sortOrder: index * 10, retired: false, requiredCapabilities: required }));
    report.serviceTypesAdded++;
  }
  report.eligibilityRulesAdded = await seedRules(manager, ELIGIBILITY_RULES);
  return report;
}

export interface FullSeedReport extends SeedReport, DemoSeedReport {
  /** What happened to the demo scenario: added (or there already), not asked for, or left out because this is production. */
  demo: 'seeded' | 'off' | 'refused-in-production';
}

export const DEMO_REFUSED_MESSAGE =
  'Demo data left out: NODE_ENV is production, and the demo accounts (a network admin among them) sign in with a published password. SEED_DEMO=force adds them anyway.';
export const DEMO_FORCED_MESSAGE =
  'SEED_DEMO=force in production: the demo accounts, a network admin among them, sign in with the password printed in the README. Never on a live site.';

/**
 * The demo scenario signs people in with a password printed in the README, a network admin among
 * them: outside production by default, in production only when SEED_DEMO=force asks for it.
 */
export function demoSeedDecision(nodeEnv: string | undefined, mode: SeedDemoMode = 'auto'): FullSeedReport['demo'] {
  if (mode === 'false') return 'off';
  if (mode === 'force' || nodeEnv !== 'production') return 'seeded';
  return 'refused-in-production';
}

/**
 * The catalogue always; the demo scenario as `demoSeedDecision` allows (never when `demo` is
 * false). Without `nodeEnv` the process's NODE_ENV decides, so a caller that forgets to pass it
 * cannot put the demo accounts into a production database. Demo documents go to `storage` (left
 * out without one); if the seed fails, the files it stored are removed again.
 */
export async function runSeed(
  manager: EntityManager,
  o: { demo?: boolean; nodeEnv?: string; seedDemo?: SeedDemoMode; passwordHashCost?: number; storage?: Storage } = {},
): Promise<FullSeedReport> {
  const decision = o.demo === false ? 'off' : demoSeedDecision(o.nodeEnv ?? process.env.NODE_ENV, o.seedDemo);
  const stored: string[] = [];
  const storage: Storage | undefined = o.storage && {
    put: async (data) => {
      const key = await o.storage!.put(data);
      stored.push(key);
      return key;
    },
    get: (key) => o.storage!.get(key),
    delete: (key) => o.storage!.delete(key),
  };
  try {
    return await manager.transaction(async (tx) => {
      const catalogue = await seedCatalogue(tx);
      const demo = decision === 'seeded' ? await seedDemo(tx, o.passwordHashCost ?? DEFAULT_PASSWORD_HASH_COST, { storage }) : { usersAdded: 0, organisationsAdded: 0, profilesAdded: 0, documentsAdded: 0 };
      return { ...catalogue, ...demo, demo: decision };
    });
  } catch (err) {
    await Promise.allSettled(stored.map((key) => o.storage!.delete(key)));
    throw err;
  }
}
