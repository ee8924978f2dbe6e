export * from './ranking';
export * from './date-range';
