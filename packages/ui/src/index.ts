// Shared UI for both apps: theme, formatting, errors, composables and components.
// Fonts and base styles are side effects: import '@emberline/ui/fonts' and '@emberline/ui/styles.css'.
// The account frames and pages carry their own styles, which would pull them and their
// ant-design-vue parts into every chunk that imports this file: import those by path instead
// (`@emberline/ui/account/account-card.vue`).
export * from './theme';
export * from './format';
export * from './errors';
export * from './composables/use-async-data';
export * from './composables/use-format';
export * from './composables/use-media-query';
export { default as sharedEn, type SharedMessages } from './locales/en';
export { vatRulesDe } from './locales/vat-rules';
export { default as StateBlock } from './components/state-block.vue';
export { default as CautionList } from './components/caution-list.vue';
export { default as BrandMark } from './components/brand-mark.vue';
export * from './composables/use-form-errors';
export { default as SignInForm } from './components/account/sign-in-form.vue';
export { default as SignUpForm } from './components/account/sign-up-form.vue';
export { default as EmailLinkForm } from './components/account/email-link-form.vue';
export { default as ResetPasswordForm } from './components/account/reset-password-form.vue';
export { default as PasswordField } from './components/account/password-field.vue';
export { default as NativeSelect } from './components/native-select.vue';
export { default as BookingStatusTag } from './components/booking-status-tag.vue';
export * from './booking-status';
