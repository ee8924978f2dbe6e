// Every entity the data source knows, in one list.
import { AuditLogEntity } from './audit-log.entity';
import { CapabilityEntity } from './capability.entity';
import { InsuranceReminderEntity } from './insurance-reminder.entity';
import { MailOutboxEntity } from './mail-outbox.entity';
import { MembershipEntity } from './membership.entity';
import { OrganisationEntity } from './organisation.entity';
import { OrganisationCapabilityEntity } from './organisation-capability.entity';
import { PartnerDocumentEntity } from './partner-document.entity';
import { PartnerProfileEntity } from './partner-profile.entity';
import { ServiceTypeEntity } from './service-type.entity';
import { InvitationEntity, OneTimeTokenEntity, RefreshTokenEntity, type OneTimePurpose } from './tokens.entity';
import { UserAccountEntity } from './user-account.entity';
import { VehicleEntity } from './vehicle.entity';

export type { OneTimePurpose };
export {
  AuditLogEntity,
  CapabilityEntity,
  InsuranceReminderEntity,
  InvitationEntity,
  MailOutboxEntity,
  MembershipEntity,
  OneTimeTokenEntity,
  OrganisationEntity,
  OrganisationCapabilityEntity,
  PartnerDocumentEntity,
  PartnerProfileEntity,
  RefreshTokenEntity,
  ServiceTypeEntity,
  UserAccountEntity,
  VehicleEntity,
};
export const entities = [
  AuditLogEntity,
  CapabilityEntity,
  InsuranceReminderEntity,
  InvitationEntity,
  MailOutboxEntity,
  MembershipEntity,
  OneTimeTokenEntity,
  OrganisationEntity,
  OrganisationCapabilityEntity,
  PartnerDocumentEntity,
  PartnerProfileEntity,
  RefreshTokenEntity,
  ServiceTypeEntity,
  UserAccountEntity,
  VehicleEntity,
];
