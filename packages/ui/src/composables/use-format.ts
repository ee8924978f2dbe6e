// Format helpers bound to the current vue-i18n locale.
import { useI18n } from 'vue-i18n';
import { formatBytes, formatDate, formatDuration, formatMoney, formatNumber, formatRegion } from '../format';

export function useFormat() {
  const { locale } = useI18n();
  return {
    number: (value: number, options?: Intl.NumberFormatOptions) => formatNumber(value, locale.value, options),
    duration: (minutes: number) => formatDuration(minutes, locale.value),
    money: (amountMinor: number | bigint, currency: string, minorUnits?: number) => formatMoney(amountMinor, currency, locale.value, minorUnits),
    date: (value: Date | string | number, options?: Intl.DateTimeFormatOptions) => formatDate(value, locale.value, options),
    region: (code: string) => formatRegion(code, locale.value),
    bytes: (bytes: number) => formatBytes(bytes, locale.value),
    days: (days: number) => formatNumber(days, locale.value, { style: 'unit', unit: 'day', unitDisplay: 'long' }),
  };
}
