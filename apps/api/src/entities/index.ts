// Every entity the data source knows, in one list.
import { CapabilityEntity } from './capability.entity';
import { ServiceTypeEntity } from './service-type.entity';

export { CapabilityEntity, ServiceTypeEntity };
export const entities = [CapabilityEntity, ServiceTypeEntity];
