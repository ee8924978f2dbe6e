// The explicit context every service receives: the entity manager to work in and who is acting.
import type { EntityManager } from 'typeorm';

export type Role = 'owner' | 'technician' | 'partner_admin' | 'network_admin';

export interface Actor {
  userId: string | null;
  roles: Role[];
  organisationId: string | null;
}

export const ANONYMOUS: Actor = Object.freeze({ userId: null, roles: [], organisationId: null }) as Actor;

export interface ServiceContext {
  manager: EntityManager;
  actor: Actor;
}
