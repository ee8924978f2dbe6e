// Every entity the data source knows, in one list.
import { AuditLogEntity } from './audit-log.entity';
import { CapabilityEntity } from './capability.entity';
import { MailOutboxEntity } from './mail-outbox.entity';
import { MembershipEntity } from './membership.entity';
import { OrganisationEntity } from './organisation.entity';
import { ServiceTypeEntity } from './service-type.entity';
import { InvitationEntity, OneTimeTokenEntity, RefreshTokenEntity, type OneTimePurpose } from './tokens.entity';
import { UserAccountEntity } from './user-account.entity';
import { VehicleEntity } from './vehicle.entity';

export type { OneTimePurpose };
export {
  AuditLogEntity,
  CapabilityEntity,
  InvitationEntity,
  MailOutboxEntity,
  MembershipEntity,
  OneTimeTokenEntity,
  OrganisationEntity,
  RefreshTokenEntity,
  ServiceTypeEntity,
  UserAccountEntity,
  VehicleEntity,
};
export const entities = [
  AuditLogEntity,
  CapabilityEntity,
  InvitationEntity,
  MailOutboxEntity,
  MembershipEntity,
  OneTimeTokenEntity,
  OrganisationEntity,
  RefreshTokenEntity,
  ServiceTypeEntity,
  UserAccountEntity,
  VehicleEntity,
];
