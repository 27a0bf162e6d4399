// The caution rules as one table: what each checks, its threshold, its words and its source.
// Thresholds and sources are those of shared/reference/safety.md; each says how sure we are.
// A rule is guidance for showing a caution, never a clearance.

/** 'verified': read in a stored copy of the source or a page quoting its clause; 'from memory': not checked. */
export type Certainty = 'verified' | 'from memory';

/** The measure a rule compares against its threshold (all in SI base units). */
export type CautionMeasure = 'peak voltage' | 'capacitor energy' | 'inductor energy' | 'charge' | 'discharge time';

export interface CautionRule {
  id: string;
  checks: CautionMeasure;
  /** Threshold in `unit`. */
  threshold: number;
  unit: 'V' | 'J' | 'C' | 's';
  /** 'at or above': fires when measure >= threshold; 'above': when measure > threshold. */
  fires: 'at or above' | 'above';
  /** Extra condition on the capacitor's voltage for energy, charge and discharge rules. */
  voltage?: { atLeast?: number; atMost?: number; below?: number; above?: number };
  /** Plain words shown when the rule fires. */
  message: string;
  source: string;
  certainty: Certainty;
}

export const CAUTION_RULES: readonly CautionRule[] = [
  {
    id: 'accessible-ac-peak',
    checks: 'peak voltage',
    threshold: 46.7,
    unit: 'V',
    fires: 'above',
    message:
      'The waveform peaks above 46.7 V, more than measuring equipment may leave on touchable parts in normal use ' +
      '(33 V rms, 46.7 V peak, 70 V DC). Treat exposed nodes as hazardous.',
    source: 'IEC 61010-1:2010, clause 6.3.1, accessible-part limits in normal condition',
    certainty: 'from memory',
  },
  {
    id: 'de-energize-50v',
    checks: 'peak voltage',
    threshold: 50,
    unit: 'V',
    fires: 'at or above',
    message:
      'The node reaches 50 V or more: live parts at this level are normally de-energized before anyone works on them. ' +
      'Power down and discharge before moving probes.',
    source: 'OSHA 29 CFR 1910.333(a)(1); NFPA 70E uses the same 50 V threshold',
    certainty: 'verified',
  },
  {
    id: 'elv-ac-crest',
    checks: 'peak voltage',
    threshold: 50 * Math.SQRT2,
    unit: 'V',
    fires: 'above',
    message:
      'The waveform peaks above 70.7 V, the crest of a 50 V rms sine: an AC signal this large is outside the ' +
      'extra-low-voltage band (at most 50 V AC rms).',
    source: 'IEC 61140:2016, ELV/SELV band 50 V AC rms (threshold derived as 50 V x sqrt 2)',
    certainty: 'verified',
  },
  {
    id: 'elv-dc',
    checks: 'peak voltage',
    threshold: 120,
    unit: 'V',
    fires: 'above',
    message:
      'The waveform exceeds 120 V, beyond the extra-low-voltage band even for ripple-free DC. ' +
      'Use probes and leads rated for the voltage and measurement category.',
    source: 'IEC 61140:2016 and IEC 61558-1 (IEV SELV entry): 120 V ripple-free DC',
    certainty: 'verified',
  },
  {
    id: 'capacitor-shock',
    checks: 'capacitor energy',
    threshold: 10,
    unit: 'J',
    fires: 'at or above',
    voltage: { atLeast: 100 },
    message:
      'The capacitor holds 10 J or more at 100 V or more: a shock hazard. Discharge it through a rated resistor ' +
      'and verify with a meter before touching.',
    source: 'LBNL Electrical Safety Manual, table 2.2.13 (after the DOE electrical-safety classification)',
    certainty: 'verified',
  },
  {
    id: 'capacitor-thermal',
    checks: 'capacitor energy',
    threshold: 100,
    unit: 'J',
    fires: 'above',
    voltage: { below: 100 },
    message:
      'The capacitor holds more than 100 J below 100 V: a short across it can burn skin and melt tools or leads ' +
      'even though the voltage is low.',
    source: 'LBNL Electrical Safety Manual, table 2.3.5',
    certainty: 'verified',
  },
  {
    id: 'capacitor-arc-flash',
    checks: 'capacitor energy',
    threshold: 10e3,
    unit: 'J',
    fires: 'at or above',
    voltage: { atLeast: 100 },
    message:
      'The capacitor holds 10 kJ or more at 100 V or more: an arc-flash hazard. Work only under your site\'s ' +
      'high-energy procedures with the bank shorted and grounded.',
    source: 'LBNL Electrical Safety Manual, table 2.3.3',
    certainty: 'verified',
  },
  {
    id: 'charge-45uc',
    checks: 'charge',
    threshold: 45e-6,
    unit: 'C',
    fires: 'above',
    message:
      'The capacitor holds more than 45 uC (V x C), more charge than an accessible part may deliver behind ' +
      'protective impedance: a discharge through the body can hurt.',
    source: 'IEC 61010-1 (2nd edition), clause 6.3.1; IEC 60335-1, clause 8.1.4',
    certainty: 'verified',
  },
  {
    id: 'inductor-energy',
    checks: 'inductor energy',
    threshold: 0.2,
    unit: 'J',
    fires: 'above',
    message:
      'The inductor stores more than 0.2 J at the peak current: interrupting that current (a probe slipping, a ' +
      'switch opening) drives a spark or a high-voltage spike across the gap.',
    source: 'SAE J1766, discussion of a 0.2 J low-energy limit for vehicle high-voltage systems (title verified, limit from memory)',
    certainty: 'from memory',
  },
  {
    id: 'slow-discharge',
    checks: 'discharge time',
    threshold: 60,
    unit: 's',
    fires: 'above',
    voltage: { above: 50, atMost: 600 },
    message:
      'The bleeder takes more than 1 minute to bring the capacitor to 50 V: slower than required for capacitors rated ' +
      '600 V or less. Wait out the discharge time and measure before touching.',
    source: 'NEC (NFPA 70) 460.6; time from t = R C ln(V0 / 50 V)',
    certainty: 'verified',
  },
  {
    id: 'slow-discharge-above-600v',
    checks: 'discharge time',
    threshold: 300,
    unit: 's',
    fires: 'above',
    voltage: { above: 600 },
    message:
      'The bleeder takes more than 5 minutes to bring the capacitor to 50 V: slower than required above 600 V. ' +
      'Wait out the discharge time, then short and ground the bank.',
    source: 'NEC (NFPA 70) 460.28; the same 5 minutes in Cal. Code Regs. Title 8, section 2893 (verified there)',
    certainty: 'from memory',
  },
];

/** The level a bleeder must bring a capacitor down to, V: NEC 460.6 / 460.28 (50 V or less). */
export const SAFE_DISCHARGE_VOLTAGE = 50;
