// The signed-in user's own account.
import { MeResponseSchema, UpdateAccountSchema } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { accountController } from '../controllers/account.controller';

export function registerAccountRoutes(api: ApiRouter, app: AppContext): void {
  const c = accountController(app);
  api.route({ method: 'get', path: '/me', summary: 'The signed-in user with memberships', tags: ['Accounts'], auth: true, response: MeResponseSchema }, c.getMe);
  api.route(
    { method: 'patch', path: '/me', summary: 'Change name or language', tags: ['Accounts'], auth: true, body: UpdateAccountSchema, response: MeResponseSchema },
    c.updateMe,
  );
}
