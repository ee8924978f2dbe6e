// Lead-acid battery use by a parking heater: charge drawn, state of charge and rest voltage.

export const BATTERY_TYPES = ['flooded', 'agm'] as const;
export type BatteryType = (typeof BATTERY_TYPES)[number];

export const SYSTEM_VOLTAGES = [12, 24] as const;
export type SystemVoltage = (typeof SYSTEM_VOLTAGES)[number];

/**
 * Open-circuit (rest) voltage of a 12 V flooded lead-acid battery against state of charge,
 * BCI, at 27 °C. Sourced: Battery Council International state-of-charge table (docs/references.md).
 */
export const BCI_OPEN_CIRCUIT_VOLTAGE_12V: ReadonlyArray<{ stateOfChargePercent: number; volts: number }> = [
  { stateOfChargePercent: 0, volts: 11.89 },
  { stateOfChargePercent: 25, volts: 12.06 },
  { stateOfChargePercent: 50, volts: 12.24 },
  { stateOfChargePercent: 75, volts: 12.45 },
  { stateOfChargePercent: 100, volts: 12.65 },
];
export const BCI_OCV_SOURCE = 'BCI open-circuit voltage table, 12 V lead-acid, 27 °C';

/**
 * AGM batteries rest about 0.1–0.2 V higher than flooded ones at the same charge
 * (battery makers' tables, from memory). The single offset used here, 0.15 V, is the middle of that range:
 * a choice, not a sourced value.
 */
export const AGM_OCV_OFFSET_12V = 0.15;

/**
 * Safe lower limit for a heater run: 50 % state of charge, about 12.24 V at rest (BCI).
 * The heater usually runs from the starter battery, which must still crank a cold engine
 * afterwards, and lead-acid life falls quickly with deeper discharge (common practice, no
 * source). The 10.5 V and 11.1–11.7 V cut-offs commonly quoted (1.75 V per cell) are terminal voltages of a
 * battery under load, at which devices switch off; at rest they mean a nearly flat battery,
 * so they are too deep for a battery that must start the engine.
 */
export const SAFE_CUT_OFF_STATE_OF_CHARGE_PERCENT = 50;

/**
 * Estimated open-circuit voltage at a state of charge: linear interpolation in the BCI
 * table, plus the AGM offset, doubled for 24 V systems (two 12 V batteries in series).
 */
export function openCircuitVoltage(stateOfChargePercent: number, type: BatteryType, systemVoltage: SystemVoltage): number {
  if (!(stateOfChargePercent >= 0 && stateOfChargePercent <= 100)) {
    throw new RangeError('State of charge must be between 0 % and 100 %');
  }
  const table = BCI_OPEN_CIRCUIT_VOLTAGE_12V;
  let volts12 = table[table.length - 1]!.volts;
  for (let i = 1; i < table.length; i++) {
    const lo = table[i - 1]!;
    const hi = table[i]!;
    if (stateOfChargePercent <= hi.stateOfChargePercent) {
      const f = (stateOfChargePercent - lo.stateOfChargePercent) / (hi.stateOfChargePercent - lo.stateOfChargePercent);
      volts12 = lo.volts + f * (hi.volts - lo.volts);
      break;
    }
  }
  const offset = type === 'agm' ? AGM_OCV_OFFSET_12V : 0;
  return (volts12 + offset) * (systemVoltage / 12);
}

/** Charge drawn from the battery: Ah = electrical draw (W) × hours ÷ nominal voltage. */
export function chargeUsedAh(drawW: number, durationSeconds: number, systemVoltage: SystemVoltage): number {
  if (!(drawW >= 0) || !(durationSeconds >= 0)) throw new RangeError('Draw and duration must be zero or positive');
  return (drawW * (durationSeconds / 3600)) / systemVoltage;
}

export interface BatteryUse {
  chargeUsedAh: number;
  startStateOfChargePercent: number;
  /** Estimated state of charge after the run, never below 0 %. */
  endStateOfChargePercent: number;
  /** Estimated rest voltage after the run (the voltage under load is lower). */
  endOpenCircuitVoltage: number;
  cutOffStateOfChargePercent: number;
  cutOffOpenCircuitVoltage: number;
  /** True when the run would take the battery below the safe cut-off. */
  belowCutOff: boolean;
  /** True when the run would use more charge than the battery holds. */
  exhausted: boolean;
}

export function batteryUse(options: {
  capacityAh: number;
  type: BatteryType;
  systemVoltage: SystemVoltage;
  drawW: number;
  durationSeconds: number;
  startStateOfChargePercent: number;
}): BatteryUse {
  const { capacityAh, type, systemVoltage, drawW, durationSeconds, startStateOfChargePercent } = options;
  if (!(capacityAh > 0)) throw new RangeError('Battery capacity must be positive');
  const used = chargeUsedAh(drawW, durationSeconds, systemVoltage);
  const rawEnd = startStateOfChargePercent - (used / capacityAh) * 100;
  const end = Math.max(0, rawEnd);
  return {
    chargeUsedAh: used,
    startStateOfChargePercent,
    endStateOfChargePercent: end,
    endOpenCircuitVoltage: openCircuitVoltage(end, type, systemVoltage),
    cutOffStateOfChargePercent: SAFE_CUT_OFF_STATE_OF_CHARGE_PERCENT,
    cutOffOpenCircuitVoltage: openCircuitVoltage(SAFE_CUT_OFF_STATE_OF_CHARGE_PERCENT, type, systemVoltage),
    belowCutOff: end < SAFE_CUT_OFF_STATE_OF_CHARGE_PERCENT,
    exhausted: rawEnd < 0,
  };
}
