// The slot engine: which start times each technician, and the organisation, can offer.
export * from './types';
export { computeSlots, toEpochMs, DEFAULT_GRID_MINUTES, MAX_SEARCH_DAYS } from './engine';
export * from './weekly-union';
export * from './own-time-off';
