export * from './vat-rates';
export * from './vat-rules';
export * from './quote';
export * from './partner-share';
export * from './cancellation-terms';
export * from './lifecycle';
