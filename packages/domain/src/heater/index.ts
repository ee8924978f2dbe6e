// Heater calculations: the pre-heat planner and the physical data it rests on.
export * from './materials';
export * from './fuels';
export * from './battery';
export * from './thermal-model';
export * from './presets';
export * from './preheat';
