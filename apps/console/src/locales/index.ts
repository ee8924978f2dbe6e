// vue-i18n for the Console: shared strings plus the app's own; German slots in beside English.
import { createI18n } from 'vue-i18n';
import { sharedEn, vatRulesDe } from '@emberline/ui';
import en from './en';

// German so far only for what the quote says about VAT; everything else falls back to English
export const messages = { en: { ...sharedEn, ...en }, de: { vatRules: vatRulesDe } };
export type MessageSchema = (typeof messages)['en'];

export const i18n = createI18n({
  legacy: false,
  locale: 'en',
  fallbackLocale: 'en',
  messages,
});
