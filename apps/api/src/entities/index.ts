// Every entity the data source knows, in one list (all.ts holds the exports, so a new entity is
// added in one place).
import * as all from './all';

export * from './all';
export const entities = Object.values(all);
