// Shared test data for the onboarding screens: an application in a given state, a catalogue.
import type { Application, Capability } from '@emberline/domain';
import { ORG_A } from './fixtures';

export const catalogue: Capability[] = [
  { code: 'uds-flash-programming', name: 'Control-unit flashing over UDS', description: '', category: 'diagnostics', standards: ['ISO 14229'], retired: false },
  { code: 'battery-support-unit', name: 'Battery support unit', description: '', category: 'electrical', standards: [], retired: false },
];

export function application(overrides: Partial<Application> = {}): Application {
  return {
    organisationId: ORG_A,
    status: 'draft',
    statusReason: null,
    business: null,
    area: null,
    capabilities: [],
    documents: [],
    changeRequest: null,
    missing: [],
    submittedAt: null,
    editable: true,
    ...overrides,
  };
}

export const business = {
  legalName: 'Ember Vans North GmbH',
  tradingName: 'Ember Vans North',
  country: 'AT' as const,
  street: 'Feldweg 4',
  postalCode: '6020',
  city: 'Innsbruck',
  vatId: null,
  phone: '+43 512 123456',
};
