// Every entity the data source knows, in one list.
import { CapabilityEntity } from './capability.entity';
import { ServiceTypeEntity } from './service-type.entity';
import { MailOutboxEntity } from './mail-outbox.entity';

export { CapabilityEntity, ServiceTypeEntity, MailOutboxEntity };
export const entities = [CapabilityEntity, ServiceTypeEntity, MailOutboxEntity];
