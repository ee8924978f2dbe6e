// The pre-heat planner's form state: presets, a garage vehicle, validation with the domain
// schema and the plan from planPreheat, all in the browser.
import { computed, reactive, ref } from 'vue';
import { useI18n } from 'vue-i18n';
import {
  PREHEAT_LIMITS,
  PREHEAT_PRESETS,
  PreheatInputSchema,
  planPreheat,
  type BatteryType,
  type CoolantMixture,
  type EngineMaterial,
  type HeaterFuel,
  type PreheatInputDraft,
  type PreheatPlan,
  type PreheatPreset,
  type SystemVoltage,
  type Vehicle,
} from '@emberline/domain';
import { useFormat } from '@emberline/ui';

// Departure comes from the browser's date and time inputs and goes to the domain as ISO 8601
// with the browser's UTC offset for that moment (right across a daylight-saving change).
const pad = (n: number) => String(n).padStart(2, '0');

/** Tomorrow at 07:30 local time, as the date and time inputs want it. */
export function defaultDeparture(now: Date = new Date()): { date: string; time: string } {
  const d = new Date(now.getFullYear(), now.getMonth(), now.getDate() + 1, 7, 30);
  return { date: `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}`, time: '07:30' };
}

/** "2026-01-15" + "07:30" → "2026-01-15T07:30:00+01:00" in the browser's zone; null if incomplete. */
export function departureIso(date: string, time: string): string | null {
  const dm = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  const tm = /^(\d{2}):(\d{2})/.exec(time);
  if (!dm || !tm) return null;
  const local = new Date(Number(dm[1]), Number(dm[2]) - 1, Number(dm[3]), Number(tm[1]), Number(tm[2]));
  if (Number.isNaN(local.getTime())) return null;
  const offset = -local.getTimezoneOffset();
  const sign = offset < 0 ? '-' : '+';
  const abs = Math.abs(offset);
  return (
    `${local.getFullYear()}-${pad(local.getMonth() + 1)}-${pad(local.getDate())}` +
    `T${pad(local.getHours())}:${pad(local.getMinutes())}:00${sign}${pad(Math.floor(abs / 60))}:${pad(abs % 60)}`
  );
}

/** The browser's IANA time zone, for the hint next to the departure fields. */
export function browserTimeZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone;
}

/** The form in the units an owner thinks in; efficiency as a percentage. */
export interface PlannerForm {
  outsideTemperatureC: number | null;
  targetCoolantTemperatureC: number | null;
  departureDate: string;
  departureTime: string;
  heaterOutputKw: number | null;
  efficiencyPercent: number | null;
  fuel: HeaterFuel;
  engineMassKg: number | null;
  engineMaterial: EngineMaterial;
  coolantVolumeL: number | null;
  coolantMixture: CoolantMixture;
  cabinVolumeM3: number | null;
  interiorHeatCapacityKjPerK: number | null;
  engineLossWPerK: number | null;
  heaterMatrixWPerK: number | null;
  cabinLossWPerK: number | null;
  batteryCapacityAh: number | null;
  batteryType: BatteryType;
  systemVoltage: SystemVoltage;
  heaterDrawW: number | null;
  startStateOfChargePercent: number | null;
}

export type PlannerField = keyof PlannerForm;
export type LimitKey = keyof typeof PREHEAT_LIMITS;

/** Where a schema path shows its error in the form. */
const FIELD_OF_PATH: Partial<Record<string, PlannerField>> = {
  combustionEfficiency: 'efficiencyPercent',
  departure: 'departureDate',
};

/** A cold winter morning, the case the planner is for. */
export const DEFAULT_OUTSIDE_TEMPERATURE_C = -15;

function presetValues(preset: PreheatPreset): Omit<PlannerForm, 'outsideTemperatureC' | 'departureDate' | 'departureTime'> {
  const { combustionEfficiency, ...rest } = preset.values;
  return { ...rest, efficiencyPercent: Math.round(combustionEfficiency * 1000) / 10 };
}

export function toDraft(form: PlannerForm): PreheatInputDraft {
  // Empty numbers go to the schema as null so they fail with the field's range message.
  const n = (value: number | null) => value as number;
  return {
    outsideTemperatureC: n(form.outsideTemperatureC),
    targetCoolantTemperatureC: n(form.targetCoolantTemperatureC),
    departure: departureIso(form.departureDate, form.departureTime) ?? '',
    heaterOutputKw: n(form.heaterOutputKw),
    combustionEfficiency: form.efficiencyPercent === null ? n(null) : form.efficiencyPercent / 100,
    fuel: form.fuel,
    engineMassKg: n(form.engineMassKg),
    engineMaterial: form.engineMaterial,
    coolantVolumeL: n(form.coolantVolumeL),
    coolantMixture: form.coolantMixture,
    cabinVolumeM3: n(form.cabinVolumeM3),
    interiorHeatCapacityKjPerK: n(form.interiorHeatCapacityKjPerK),
    engineLossWPerK: n(form.engineLossWPerK),
    heaterMatrixWPerK: n(form.heaterMatrixWPerK),
    cabinLossWPerK: n(form.cabinLossWPerK),
    batteryCapacityAh: n(form.batteryCapacityAh),
    batteryType: form.batteryType,
    systemVoltage: form.systemVoltage,
    heaterDrawW: n(form.heaterDrawW),
    startStateOfChargePercent: n(form.startStateOfChargePercent),
  };
}

export function usePreheatPlan() {
  const { t } = useI18n();
  const format = useFormat();
  const first = PREHEAT_PRESETS[0]!;
  const departure = defaultDeparture();
  const presetId = ref(first.id);
  const form = reactive<PlannerForm>({
    outsideTemperatureC: DEFAULT_OUTSIDE_TEMPERATURE_C,
    departureDate: departure.date,
    departureTime: departure.time,
    ...presetValues(first),
  });

  function applyPreset(id: string): void {
    const preset = PREHEAT_PRESETS.find((p) => p.id === id);
    if (!preset) return;
    presetId.value = preset.id;
    Object.assign(form, presetValues(preset));
  }

  /** A garage vehicle: the preset of the same model (if any), then its battery, voltage and fuel. */
  function applyVehicle(vehicle: Vehicle): void {
    const preset = PREHEAT_PRESETS.find((p) => vehicle.model === p.name || vehicle.model.startsWith(`${p.name} `));
    if (preset) applyPreset(preset.id);
    form.batteryCapacityAh = vehicle.batteryCapacityAh;
    form.batteryType = vehicle.batteryType;
    form.systemVoltage = vehicle.electricalSystemV;
    form.fuel = vehicle.fuel;
  }

  const draft = computed(() => toDraft(form));
  const parsed = computed(() => PreheatInputSchema.safeParse(draft.value));

  const withUnit = (value: number, unit: string) => (unit ? t('planner.withUnit', { value: format.number(value), unit }) : format.number(value));

  /** The allowed range of a field, in the form's units. */
  function limitsOf(field: PlannerField): { min: number; max: number; unit: string; minExclusive: boolean } | null {
    if (field === 'efficiencyPercent') return { min: 0, max: 100, unit: '%', minExclusive: true };
    if (!(field in PREHEAT_LIMITS)) return null;
    const l: { min: number; max: number; unit: string; minExclusive?: boolean } = PREHEAT_LIMITS[field as LimitKey];
    return { min: l.min, max: l.max, unit: l.unit, minExclusive: !!l.minExclusive };
  }

  function rangeHint(field: PlannerField): string | undefined {
    const l = limitsOf(field);
    if (!l) return undefined;
    return t(l.minExclusive ? 'planner.rangeHintExclusive' : 'planner.rangeHint', { min: withUnit(l.min, l.unit), max: withUnit(l.max, l.unit) });
  }

  function rangeMessage(field: PlannerField): string {
    const l = limitsOf(field);
    const label = t(`planner.fields.${field}`);
    if (!l) return t('planner.errors.invalid');
    return t(l.minExclusive ? 'planner.errors.rangeExclusive' : 'planner.errors.range', {
      label,
      min: withUnit(l.min, l.unit),
      max: withUnit(l.max, l.unit),
    });
  }

  /** One message per field, worded here (with its range) from the schema's issues. */
  const fieldErrors = computed<Partial<Record<PlannerField, string>>>(() => {
    const result = parsed.value;
    if (result.success) return {};
    const out: Partial<Record<PlannerField, string>> = {};
    for (const issue of result.error.issues) {
      const path = String(issue.path[0] ?? '');
      const field = FIELD_OF_PATH[path] ?? (path as PlannerField);
      if (out[field]) continue;
      if (path === 'departure') out[field] = t('planner.errors.departure');
      else if (issue.code === 'custom' && path === 'targetCoolantTemperatureC') {
        out[field] = t('planner.errors.targetAboveOutside', {
          label: t('planner.fields.targetCoolantTemperatureC'),
          outside: withUnit(form.outsideTemperatureC ?? 0, '°C'),
          max: withUnit(PREHEAT_LIMITS.targetCoolantTemperatureC.max, '°C'),
        });
      } else if (limitsOf(field)) out[field] = rangeMessage(field);
      else out[field] = issue.message;
    }
    return out;
  });

  const plan = computed<PreheatPlan | null>(() => {
    if (!parsed.value.success) return null;
    try {
      return planPreheat(draft.value);
    } catch {
      return null;
    }
  });
  /** Valid input the model still could not solve (should not happen inside the ranges). */
  const failed = computed(() => parsed.value.success && plan.value === null);

  return { form, presetId, applyPreset, applyVehicle, draft, fieldErrors, rangeHint, plan, failed, withUnit };
}
