export * from './vat-rates';
export * from './quote';
