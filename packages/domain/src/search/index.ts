export * from './ranking';
