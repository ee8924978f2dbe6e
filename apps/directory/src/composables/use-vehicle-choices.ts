// The vehicle choices shared by the search form and the booking flow: the select options with a
// "not sure" first, and a garage vehicle in words.
import { computed } from 'vue';
import { useI18n } from 'vue-i18n';
import { CLIMATE_CONTROLS, FACTORY_HEATERS, HEATER_FUELS, type Vehicle } from '@emberline/domain';

export function useVehicleChoices() {
  const { t } = useI18n();
  const notSure = { value: '' as const, label: t('garage.notSure') };
  const fuelOptions = computed(() => [notSure, ...HEATER_FUELS.map((v) => ({ value: v, label: t(`garage.options.fuel.${v}`) }))]);
  const heaterOptions = computed(() => [notSure, ...FACTORY_HEATERS.map((v) => ({ value: v, label: t(`garage.options.factoryHeater.${v}`) }))]);
  const climateOptions = computed(() => [notSure, ...CLIMATE_CONTROLS.map((v) => ({ value: v, label: t(`garage.options.climateControl.${v}`) }))]);
  const voltageOptions = computed(() => [notSure, ...(['12', '24'] as const).map((v) => ({ value: v, label: t(`garage.options.electricalSystemV.${v}`) }))]);

  /** "Korvan Cargo 4, 2021 · Diesel · … · automatic climate control · 12 V". */
  function describe(v: Vehicle): string {
    return [
      t('garage.modelYear', { model: v.model, year: v.year }),
      t(`garage.options.fuel.${v.fuel}`),
      t(`garage.options.factoryHeater.${v.factoryHeater}`),
      t('garage.climateSummary', { value: t(`garage.options.climateControl.${v.climateControl}`) }),
      t(`garage.options.electricalSystemV.${v.electricalSystemV}`),
    ].join(' · ');
  }

  return { fuelOptions, heaterOptions, climateOptions, voltageOptions, describe };
}
