export * from './engine';
