// Typed client for the Emberline API, shared by both apps and the tests.
export * from './http';
export * from './catalogue';
export * from './health';
export * from './accounts';
export * from './account-api';
export * from './vehicles';
export * from './session-clients';
export * from './onboarding';
export * from './offers';
export * from './search';
export * from './bookings';
