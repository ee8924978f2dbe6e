export * from './vat-rates';
export * from './vat-rules';
export * from './quote';
export * from './lifecycle';
