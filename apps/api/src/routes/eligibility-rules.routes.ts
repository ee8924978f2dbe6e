// The vehicle rules: read publicly (what the search applies), changed by network admins.
import { z } from 'zod';
import { CatalogueCodeSchema, EligibilityRuleInputSchema, EligibilityRuleListSchema, EligibilityRuleSchema } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { eligibilityRulesController } from '../controllers/eligibility-rules.controller';

const CodeParams = z.object({ code: CatalogueCodeSchema });
const RuleResponse = z.object({ data: EligibilityRuleSchema });
const codesChecked = 'Service types (in `serviceTypes` and `effect.suggestServiceTypes`) and capabilities (`effect.addCapabilities`) must be in the catalogue and not retired, else 400 naming each.';

export function registerEligibilityRuleRoutes(api: ApiRouter, app: AppContext): void {
  const c = eligibilityRulesController(app);
  const roles = ['network_admin' as const];
  const tags = ['Network admin'];
  api.route(
    {
      method: 'get',
      path: '/catalogue/eligibility-rules',
      summary: 'The vehicle rules the search applies, in order',
      description: 'Active rules for everyone; a signed-in network admin also gets the rules that are switched off.',
      tags: ['Catalogue'],
      optionalAuth: true,
      response: EligibilityRuleListSchema,
    },
    c.list,
  );
  api.route(
    {
      method: 'post',
      path: '/admin/eligibility-rules',
      summary: 'Add a vehicle rule (it goes last)',
      description: `${codesChecked} A code in use is 409 RULE_EXISTS.`,
      tags,
      roles,
      body: EligibilityRuleInputSchema,
      response: RuleResponse,
      status: 201,
      problems: [409],
    },
    c.create,
  );
  api.route(
    {
      method: 'put',
      path: '/admin/eligibility-rules/:code',
      summary: 'Replace a vehicle rule (its code and place in the order stay)',
      description: `${codesChecked} The body's \`code\` must be the rule's.`,
      tags,
      roles,
      params: CodeParams,
      body: EligibilityRuleInputSchema,
      response: RuleResponse,
      problems: [404],
    },
    c.update,
  );
  api.route(
    {
      method: 'delete',
      path: '/admin/eligibility-rules/:code',
      summary: 'Delete a vehicle rule (a starting rule is not seeded back)',
      tags,
      roles,
      params: CodeParams,
      response: z.object({ data: z.object({ deleted: z.literal(true) }) }),
      problems: [404],
    },
    c.remove,
  );
}
