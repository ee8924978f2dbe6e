// Shared UI for both apps: theme, formatting, errors, composables and components.
// Fonts and base styles are side effects: import '@emberline/ui/fonts' and '@emberline/ui/styles.css'.
export * from './theme';
export * from './format';
export * from './errors';
export * from './composables/use-async-data';
export * from './composables/use-format';
export * from './composables/use-media-query';
export { default as sharedEn, type SharedMessages } from './locales/en';
export { default as StateBlock } from './components/state-block.vue';
export { default as CautionList } from './components/caution-list.vue';
export { default as BrandMark } from './components/brand-mark.vue';
