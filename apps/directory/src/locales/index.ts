// vue-i18n for the Directory: shared strings plus the app's own; German slots in beside English.
import { createI18n } from 'vue-i18n';
import { sharedEn, vatRulesDe } from '@emberline/ui';
import bookingNavEn from './booking-nav.en';
import en from './en';
import garageEn from './garage.en';
import plannerEn from './planner.en';

// German so far only for what the quote says about VAT; everything else falls back to English
export const messages = { en: { ...sharedEn, ...en, ...plannerEn, ...garageEn, ...bookingNavEn }, de: { vatRules: vatRulesDe } };
export type MessageSchema = (typeof messages)['en'];

export const i18n = createI18n({
  legacy: false,
  locale: 'en',
  fallbackLocale: 'en',
  messages,
});

let bookingMessages: Promise<void> | null = null;
/** The booking pages' messages, merged in when one of them is first opened: out of the first load. */
export function loadBookingMessages(): Promise<void> {
  bookingMessages ??= import('./booking.en').then(
    ({ default: messages }) => i18n.global.mergeLocaleMessage('en', messages),
    (error: unknown) => {
      // a failed chunk load is tried again on the next navigation
      bookingMessages = null;
      throw error;
    },
  );
  return bookingMessages;
}
