// The entity classes, one export each; index.ts turns them into the data source's list.
export { AuditLogEntity } from './audit-log.entity';
export { CapabilityEntity } from './capability.entity';
export { InsuranceReminderEntity } from './insurance-reminder.entity';
export { MailOutboxEntity } from './mail-outbox.entity';
export { MembershipEntity } from './membership.entity';
export { OrganisationEntity } from './organisation.entity';
export { OrganisationCapabilityEntity } from './organisation-capability.entity';
export { PartnerDocumentEntity } from './partner-document.entity';
export { PartnerProfileEntity } from './partner-profile.entity';
export { ServiceTypeEntity } from './service-type.entity';
export { InvitationEntity, OneTimeTokenEntity, RefreshTokenEntity, type OneTimePurpose } from './tokens.entity';
export { UserAccountEntity } from './user-account.entity';
export { VehicleEntity } from './vehicle.entity';
