export * from './vat-rates';
export * from './quote';
export * from './lifecycle';
