// The vehicle rules kept with the catalogue: read by the search (active ones, in order), listed
// publicly, and edited by network admins. Every change is audited.
import type { EntityManager } from 'typeorm';
import { EligibilityRuleInputSchema, type EligibilityRule, type EligibilityRuleInput, type FieldError, type RuleCondition } from '@emberline/domain';
import type { ServiceContext } from '../lib/context';
import { createError, NotFound, ValidationFailed } from '../lib/errors';
import { audit } from './audit.service';
import { json } from '../lib/json-column';

export const RuleExists = createError('RULE_EXISTS', 409, 'A rule with this code exists already');

export type EligibilityRuleView = EligibilityRule & { updatedAt: string };

interface RuleRow {
  code: string;
  service_types: unknown;
  when_json: unknown;
  effect: unknown;
  active: number;
  updated_at: Date;
}

const toRule = (r: RuleRow): EligibilityRuleView => ({
  code: r.code,
  serviceTypes: json<string[]>(r.service_types),
  when: json<RuleCondition>(r.when_json),
  effect: json<EligibilityRule['effect']>(r.effect),
  active: Boolean(Number(r.active)),
  updatedAt: (r.updated_at instanceof Date ? r.updated_at : new Date(r.updated_at)).toISOString(),
});

const SELECT = 'SELECT code, service_types, when_json, effect, active, updated_at FROM eligibility_rule WHERE deleted_at IS NULL';

/** The rules the search applies, in their order (one query). */
export async function activeRules(manager: EntityManager): Promise<EligibilityRuleView[]> {
  const rows: RuleRow[] = await manager.query(`${SELECT} AND active = 1 ORDER BY sort_order, code`);
  return rows.map(toRule);
}

/** Every rule that is not deleted; `includeInactive` for network admins. */
export async function listRules(ctx: ServiceContext, o: { includeInactive: boolean }): Promise<EligibilityRuleView[]> {
  const rows: RuleRow[] = await ctx.manager.query(`${SELECT}${o.includeInactive ? '' : ' AND active = 1'} ORDER BY sort_order, code`);
  return rows.map(toRule);
}

async function findRow(manager: EntityManager, code: string, lock = false): Promise<(RuleRow & { deleted_at: Date | null }) | undefined> {
  const [row] = await manager.query(`SELECT code, service_types, when_json, effect, active, updated_at, deleted_at FROM eligibility_rule WHERE code = ?${lock ? ' FOR UPDATE' : ''}`, [code]);
  return row;
}

/** Field errors for service types and capabilities the catalogue does not have (or has retired). */
async function checkCodes(manager: EntityManager, rule: EligibilityRule): Promise<FieldError[]> {
  const serviceCodes = [...new Set([...rule.serviceTypes, ...rule.effect.suggestServiceTypes])];
  const capabilityCodes = [...new Set(rule.effect.addCapabilities)];
  const types: { code: string; retired: number }[] = serviceCodes.length ? await manager.query('SELECT code, retired FROM service_type WHERE code IN (?)', [serviceCodes]) : [];
  const capabilities: { code: string; retired: number }[] = capabilityCodes.length ? await manager.query('SELECT code, retired FROM capability WHERE code IN (?)', [capabilityCodes]) : [];
  const typeState = new Map(types.map((t) => [t.code, Number(t.retired) ? 'retired' : 'ok']));
  const capabilityState = new Map(capabilities.map((c) => [c.code, Number(c.retired) ? 'retired' : 'ok']));
  const errors: FieldError[] = [];
  const check = (state: Map<string, string>, what: string) => (code: string, path: string) => {
    const s = state.get(code);
    if (!s) errors.push({ path, message: `There is no ${what} "${code}" in the catalogue` });
    else if (s === 'retired') errors.push({ path, message: `The ${what} "${code}" is retired` });
  };
  const serviceType = check(typeState, 'service type');
  rule.serviceTypes.forEach((code, i) => serviceType(code, `serviceTypes.${i}`));
  rule.effect.suggestServiceTypes.forEach((code, i) => serviceType(code, `effect.suggestServiceTypes.${i}`));
  rule.effect.addCapabilities.forEach((code, i) => check(capabilityState, 'capability')(code, `effect.addCapabilities.${i}`));
  return errors;
}

async function write(manager: EntityManager, rule: EligibilityRule, sortOrder: number | null): Promise<void> {
  const values = [JSON.stringify(rule.serviceTypes), JSON.stringify(rule.when), JSON.stringify(rule.effect), rule.active ? 1 : 0];
  if (sortOrder === null) {
    await manager.query('UPDATE eligibility_rule SET service_types = ?, when_json = ?, effect = ?, active = ?, deleted_at = NULL WHERE code = ?', [...values, rule.code]);
  } else {
    await manager.query(
      `INSERT INTO eligibility_rule (code, service_types, when_json, effect, active, sort_order) VALUES (?, ?, ?, ?, ?, ?)
       ON DUPLICATE KEY UPDATE service_types = VALUES(service_types), when_json = VALUES(when_json), effect = VALUES(effect), active = VALUES(active), sort_order = VALUES(sort_order), deleted_at = NULL`,
      [rule.code, ...values, sortOrder],
    );
  }
}

async function nextSortOrder(manager: EntityManager): Promise<number> {
  const [row]: { n: number | null }[] = await manager.query('SELECT MAX(sort_order) AS n FROM eligibility_rule');
  return Number(row?.n ?? -10) + 10;
}

async function reread(manager: EntityManager, code: string): Promise<EligibilityRuleView> {
  return toRule((await findRow(manager, code))!);
}

/** A new rule goes last. A code that was deleted before may be used again (the old row is reused). */
export async function createRule(ctx: ServiceContext, input: EligibilityRule): Promise<EligibilityRuleView> {
  const errors = await checkCodes(ctx.manager, input);
  if (errors.length) throw ValidationFailed('Please correct the highlighted fields.', errors);
  const existing = await findRow(ctx.manager, input.code, true);
  if (existing && !existing.deleted_at) throw RuleExists(`The code "${input.code}" is taken: change that rule, or choose another code.`);
  await write(ctx.manager, input, await nextSortOrder(ctx.manager));
  const after = await reread(ctx.manager, input.code);
  await audit(ctx, { action: 'eligibility-rule.create', entityType: 'eligibility-rule', entityId: input.code, after });
  return after;
}

/** Replaces the rule as a whole; its code and place in the order stay. */
export async function updateRule(ctx: ServiceContext, code: string, input: EligibilityRule): Promise<EligibilityRuleView> {
  const existing = await findRow(ctx.manager, code, true);
  if (!existing || existing.deleted_at) throw NotFound(`There is no rule "${code}".`);
  const errors = await checkCodes(ctx.manager, input);
  if (input.code !== code) errors.unshift({ path: 'code', message: `Codes are stable: this rule is "${code}"` });
  if (errors.length) throw ValidationFailed('Please correct the highlighted fields.', errors);
  const before = toRule(existing);
  await write(ctx.manager, input, null);
  const after = await reread(ctx.manager, code);
  await audit(ctx, { action: 'eligibility-rule.update', entityType: 'eligibility-rule', entityId: code, before, after });
  return after;
}

/** Deleted rules keep their row (marked deleted), so the starting rules are not seeded back. */
export async function deleteRule(ctx: ServiceContext, code: string): Promise<void> {
  const existing = await findRow(ctx.manager, code, true);
  if (!existing || existing.deleted_at) throw NotFound(`There is no rule "${code}".`);
  await ctx.manager.query('UPDATE eligibility_rule SET deleted_at = CURRENT_TIMESTAMP(3), active = 0 WHERE code = ?', [code]);
  await audit(ctx, { action: 'eligibility-rule.delete', entityType: 'eligibility-rule', entityId: code, before: toRule(existing), after: null });
}

/** Inserts the starting rules whose codes the table does not know yet (deleted ones included); never changes a rule. */
export async function seedRules(manager: EntityManager, rules: readonly EligibilityRuleInput[]): Promise<number> {
  const known = new Set(((await manager.query('SELECT code FROM eligibility_rule')) as { code: string }[]).map((r) => r.code));
  let order = await nextSortOrder(manager);
  let added = 0;
  for (const input of rules) {
    const rule = EligibilityRuleInputSchema.parse(input);
    if (known.has(rule.code)) continue;
    await manager.query('INSERT INTO eligibility_rule (code, service_types, when_json, effect, active, sort_order) VALUES (?, ?, ?, ?, ?, ?)', [
      rule.code,
      JSON.stringify(rule.serviceTypes),
      JSON.stringify(rule.when),
      JSON.stringify(rule.effect),
      rule.active ? 1 : 0,
      order,
    ]);
    order += 10;
    added++;
  }
  return added;
}
