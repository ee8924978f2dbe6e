// vue-i18n for the Directory: shared strings plus the app's own; German slots in beside English.
import { createI18n } from 'vue-i18n';
import { sharedEn } from '@emberline/ui';
import en from './en';
import garageEn from './garage.en';
import plannerEn from './planner.en';

export const messages = { en: { ...sharedEn, ...en, ...plannerEn, ...garageEn } };
export type MessageSchema = (typeof messages)['en'];

export const i18n = createI18n({
  legacy: false,
  locale: 'en',
  fallbackLocale: 'en',
  messages,
});
