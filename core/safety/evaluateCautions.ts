// Applies the caution rules to the voltages, currents and components of a measurement.

import { InputError } from '../inputError';

import { quantity, type Quantity } from '../quantity';
import { CAUTION_RULES, SAFE_DISCHARGE_VOLTAGE, type CautionMeasure, type CautionRule, type Certainty } from './cautionRules';
import { DEFERRAL, STANDING_ADVICE, STANDING_ADVICE_SOURCE } from './standingAdvice';

/** What the rules look at, SI base units; every field optional (a rule needing a missing one stays silent). */
export interface CautionInputs {
  /** Largest |V| seen on the node, V (the sign is ignored). */
  peakVoltage?: number;
  /** Capacitance that can hold charge, F. */
  capacitance?: number;
  /** Inductance carrying the peak current, H. */
  inductance?: number;
  /** Largest |I| through the inductance, A (the sign is ignored). */
  peakCurrent?: number;
  /** Voltage the capacitor is charged to, V; default the peak voltage. */
  capacitorVoltage?: number;
  /** Resistance discharging the capacitor when power is removed, ohm. */
  bleederResistance?: number;
  /** Why a capture's peak was weighed neither as a voltage nor as a current (its unit is neither V nor A). */
  peakNotWeighed?: string;
}

export interface Caution {
  id: string;
  checks: CautionMeasure;
  message: string;
  measured: Quantity;
  threshold: Quantity;
  source: string;
  certainty: Certainty;
}

export interface CautionResult {
  fired: Caution[];
  energies: { capacitor?: Quantity; inductor?: Quantity };
  /** Charge V x C on the capacitor, when both are known. */
  charge?: Quantity;
  /** Time for the bleeder to bring the capacitor to 50 V, when R, C and a voltage above 50 V are known. */
  discharge?: { time: Quantity; toVoltage: number };
  /** Why the capture's peak was not weighed (a channel without V or A): no rule firing then says nothing of it. */
  peakNotWeighed?: string;
  advice: string[];
  adviceSource: string;
  deferral: string;
}

/** An input that is not a finite, non-negative number: names the field. */
export class CautionInputError extends InputError {
  readonly field: string;
  constructor(field: string, value: unknown) {
    super(`${field}: must be a finite, non-negative number in SI base units, got ${String(value)}`, field);
    this.name = 'CautionInputError';
    this.field = field;
  }
}

export function evaluateCautions(inputs: CautionInputs): CautionResult {
  const peakVoltage = magnitude(inputs, 'peakVoltage');
  const capacitorVoltage = magnitude(inputs, 'capacitorVoltage') ?? peakVoltage;
  const capacitance = magnitude(inputs, 'capacitance');
  const inductance = magnitude(inputs, 'inductance');
  const peakCurrent = magnitude(inputs, 'peakCurrent');
  const bleeder = magnitude(inputs, 'bleederResistance');

  const measures: Partial<Record<CautionMeasure, number>> = {};
  const voltages = [peakVoltage, capacitorVoltage].filter((v): v is number => v !== undefined);
  if (voltages.length) measures['peak voltage'] = Math.max(...voltages);
  if (capacitance !== undefined && capacitorVoltage !== undefined) {
    measures['capacitor energy'] = (capacitance * capacitorVoltage * capacitorVoltage) / 2;
    measures.charge = capacitance * capacitorVoltage;
    if (bleeder !== undefined && capacitorVoltage > SAFE_DISCHARGE_VOLTAGE) {
      measures['discharge time'] = bleeder * capacitance * Math.log(capacitorVoltage / SAFE_DISCHARGE_VOLTAGE);
    }
  }
  if (inductance !== undefined && peakCurrent !== undefined) {
    measures['inductor energy'] = (inductance * peakCurrent * peakCurrent) / 2;
  }

  const fired: Caution[] = [];
  for (const rule of CAUTION_RULES) {
    const value = measures[rule.checks];
    if (value === undefined || !reaches(rule, value) || !voltageHolds(rule, capacitorVoltage)) continue;
    fired.push({
      id: rule.id,
      checks: rule.checks,
      message: rule.message,
      measured: quantity(value, null, rule.unit),
      threshold: quantity(rule.threshold, null, rule.unit),
      source: rule.source,
      certainty: rule.certainty,
    });
  }

  const result: CautionResult = {
    fired,
    energies: {},
    advice: [...STANDING_ADVICE],
    adviceSource: STANDING_ADVICE_SOURCE,
    deferral: DEFERRAL,
  };
  if (measures['capacitor energy'] !== undefined) result.energies.capacitor = quantity(measures['capacitor energy'], null, 'J');
  if (measures['inductor energy'] !== undefined) result.energies.inductor = quantity(measures['inductor energy'], null, 'J');
  if (measures.charge !== undefined) result.charge = quantity(measures.charge, null, 'C');
  if (measures['discharge time'] !== undefined) {
    result.discharge = { time: quantity(measures['discharge time'], null, 's'), toVoltage: SAFE_DISCHARGE_VOLTAGE };
  }
  if (inputs.peakNotWeighed) result.peakNotWeighed = inputs.peakNotWeighed;
  return result;
}

function magnitude(inputs: CautionInputs, field: keyof CautionInputs): number | undefined {
  const value = inputs[field];
  if (value === undefined) return undefined;
  if (typeof value !== 'number' || !Number.isFinite(value)) throw new CautionInputError(field, value);
  const absolute = field === 'peakVoltage' || field === 'peakCurrent' || field === 'capacitorVoltage' ? Math.abs(value) : value;
  if (absolute < 0) throw new CautionInputError(field, value);
  return absolute;
}

function reaches(rule: CautionRule, value: number): boolean {
  return rule.fires === 'at or above' ? value >= rule.threshold : value > rule.threshold;
}

function voltageHolds(rule: CautionRule, voltage: number | undefined): boolean {
  const condition = rule.voltage;
  if (!condition) return true;
  if (voltage === undefined) return false;
  if (condition.atLeast !== undefined && !(voltage >= condition.atLeast)) return false;
  if (condition.atMost !== undefined && !(voltage <= condition.atMost)) return false;
  if (condition.below !== undefined && !(voltage < condition.below)) return false;
  if (condition.above !== undefined && !(voltage > condition.above)) return false;
  return true;
}
