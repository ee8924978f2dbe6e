// The explicit context every service receives: the entity manager to work in and who is acting.
import type { EntityManager } from 'typeorm';
import type { Role } from '@emberline/domain';

export type { Role };

export interface Actor {
  userId: string | null;
  /** Platform roles plus, inside an organisation route, the role held there. */
  roles: Role[];
  /** The organisation an /orgs/:orgId route acts in, after membership was checked. */
  organisationId: string | null;
  ip?: string | null;
}

export const ANONYMOUS: Actor = Object.freeze({ userId: null, roles: [], organisationId: null }) as Actor;

export interface ServiceContext {
  manager: EntityManager;
  actor: Actor;
}
