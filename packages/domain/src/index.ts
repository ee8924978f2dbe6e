// Public surface of the pure domain package: schemas and computations, no I/O.
export * from './schemas/problem';
export * from './schemas/catalogue';
export * from './schemas/health';
export * from './heater';
export * from './schemas/preheat';
export * from './schemas/accounts';
export * from './schemas/vehicles';
export * from './schemas/onboarding';
export * from './geo';
export * from './slots';
export * from './schemas/hours';
export * from './schemas/offers';
export * from './vetting/insurance';
export * from './schemas/eligibility';
export * from './eligibility';
export * from './schemas/search';
export * from './search';
