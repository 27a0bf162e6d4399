// The design file of a circuit under test (our own JSON layout): reading with field-path errors, writing.

import { InputError } from '../inputError';
import { parseQuantityText, quotedValue } from '../units/parseQuantity';
import { COMPONENT_NAMES, COMPONENT_UNITS, type ComponentName, type Topology } from './relations';
import { DECISION_RULE_NAMES, type DecisionRuleSpec, type QuantityLimits } from './decisionRule';
import { parseJsonStrictly } from './designJson';
import { outOfReach } from './plausibility';

/** What the channel measures: the voltage across C, the current in L, or the voltage across R. */
export type Probe = 'capacitor-voltage' | 'inductor-current' | 'resistor-voltage';

export const PROBES: readonly Probe[] = ['capacitor-voltage', 'inductor-current', 'resistor-voltage'];
export const DESIGN_FORMAT = 'ringbench-design';
export const DESIGN_VERSION = 1;

export interface ComponentSpec {
  /** SI base units: ohm, H, F. */
  value: number;
  /** Relative tolerance (0.05 = 5 %), read as a rectangular half-width; 0 when the file gives none. */
  tolerance: number;
}

/**
 * step: the source jumps from initialLevel to initialLevel + amplitude with the circuit settled before.
 *   Series: a voltage source driving R-L-C (V). Parallel: a current source into R || L || C (A).
 * natural: the source is zero after the event; the capacitor voltage (V) and the inductor current (A,
 *   series: the loop current charging C; parallel: node to ground through L) are given at the event.
 * levelTolerance: how far the probed levels may sit from the design's, relative (0.05 = 5 %, read as a
 *   rectangular half-width like the component tolerances); absent: the verdict's default (see verdict.ts).
 */
export type DesignSource = (
  | { kind: 'step'; amplitude: number; initialLevel: number }
  | { kind: 'natural'; capacitorVoltage: number; inductorCurrent: number }
) & { levelTolerance?: number };

/**
 * Quantities a design may limit directly, with the unit of their limits: f0 = omega0 / 2 pi; overshoot in %
 * of the step; settlingTime2 and settlingTime5 from the event until the response stays within 2 % and 5 %.
 */
export const LIMIT_UNITS = { f0: 'Hz', zeta: '', Q: '', R: 'ohm', L: 'H', C: 'F', overshoot: '%', settlingTime2: 's', settlingTime5: 's' } as const;
export type LimitedQuantity = keyof typeof LIMIT_UNITS;
export const LIMITED_QUANTITIES = Object.keys(LIMIT_UNITS) as LimitedQuantity[];

export interface Design {
  format: typeof DESIGN_FORMAT;
  version: typeof DESIGN_VERSION;
  name: string;
  topology: Topology;
  components: Record<ComponentName, ComponentSpec>;
  source: DesignSource;
  probe: Probe;
  /** Limits stated directly, SI base units (overshoot in %): each replaces the limits the tolerances give that quantity. */
  limits?: Partial<Record<LimitedQuantity, QuantityLimits>>;
  /** The decision rule of the verdict; absent: the default (see decisionRule.ts). */
  decisionRule?: DecisionRuleSpec;
  /** Free text for the reader of the file. */
  notes?: string;
}

/** Invalid design text; `path` names the field ('components.L.tolerance'), '' for the whole file. */
export class DesignError extends InputError {
  readonly path: string;
  constructor(path: string, problem: string) {
    super(path === '' ? `design: ${problem}` : `design ${path}: ${problem}`, path === '' ? 'design' : path);
    this.name = 'DesignError';
    this.path = path;
  }
}

type Json = Record<string, unknown>;

/** A design is a few kilobytes (its notes included): text over 1 MiB is no design file (a capture given as one?). */
export const MAX_DESIGN_BYTES = 1 << 20;

/**
 * A design from its JSON text. Component values and source levels may be numbers or strings with SI
 * prefixes ('4.7', '2.2u', '470nF', '4k7'), within what a bench circuit holds; every field is checked (a key given
 * twice too: designJson.ts) and the first fault is thrown as a DesignError naming its path.
 */
export function parseDesign(jsonText: string): Design {
  if (jsonText.length > MAX_DESIGN_BYTES) throw new DesignError('', 'the text is over 1 MiB: a design file is a few kilobytes (is it a capture?)');
  const root = parseJsonStrictly(jsonText, (path, problem) => {
    throw new DesignError(path, problem);
  });
  const top = object(root, '');
  allowOnly(top, '', ['format', 'version', 'name', 'topology', 'components', 'source', 'probe', 'limits', 'decisionRule', 'notes']);
  if (top.format !== DESIGN_FORMAT) throw new DesignError('format', `must be "${DESIGN_FORMAT}"`);
  if (top.version !== DESIGN_VERSION) throw new DesignError('version', `must be ${DESIGN_VERSION} (this program reads version ${DESIGN_VERSION})`);
  const name = text(top.name, 'name');
  const topology = oneOf(top.topology, 'topology', ['series', 'parallel'] as const);
  const probe = oneOf(top.probe, 'probe', PROBES);
  const design: Design = {
    format: DESIGN_FORMAT,
    version: DESIGN_VERSION,
    name,
    topology,
    components: readComponents(top.components),
    source: readSource(top.source, topology),
    probe,
  };
  if (top.limits !== undefined) design.limits = checkLimitsDecidable(readLimits(top.limits), design.source);
  if (top.decisionRule !== undefined) design.decisionRule = readDecisionRule(top.decisionRule);
  if (top.notes !== undefined) design.notes = text(top.notes, 'notes', true);
  return design;
}

/** The design as JSON text (numbers in SI base units), readable by parseDesign. */
export function serializeDesign(design: Design): string {
  const { format, version, name, topology, components, source, probe, limits, decisionRule, notes } = design;
  const ordered = {
    format,
    version,
    name,
    topology,
    components,
    source,
    probe,
    ...(limits === undefined ? {} : { limits }),
    ...(decisionRule === undefined ? {} : { decisionRule }),
    ...(notes === undefined ? {} : { notes }),
  };
  return `${JSON.stringify(ordered, null, 2)}\n`;
}

function readComponents(value: unknown): Record<ComponentName, ComponentSpec> {
  const node = object(value, 'components');
  allowOnly(node, 'components', COMPONENT_NAMES);
  const result = {} as Record<ComponentName, ComponentSpec>;
  for (const name of COMPONENT_NAMES) {
    const path = `components.${name}`;
    if (node[name] === undefined) throw new DesignError(path, 'is missing (R, L and C are all needed)');
    const spec = object(node[name], path);
    allowOnly(spec, path, ['value', 'tolerance']);
    const v = measure(spec.value, `${path}.value`, COMPONENT_UNITS[name]);
    if (!(v > 0)) throw new DesignError(`${path}.value`, `must be positive, got ${v}`);
    const beyond = outOfReach(name, v);
    if (beyond) throw new DesignError(`${path}.value`, `${beyond}: a lost prefix or exponent?`);
    result[name] = { value: v, tolerance: fraction(spec.tolerance ?? 0, `${path}.tolerance`) };
  }
  return result;
}

function readSource(value: unknown, topology: Topology): DesignSource {
  const node = object(value, 'source');
  const kind = oneOf(node.kind, 'source.kind', ['step', 'natural'] as const);
  const levelTolerance = node.levelTolerance === undefined ? {} : { levelTolerance: fraction(node.levelTolerance, 'source.levelTolerance') };
  if (kind === 'step') {
    allowOnly(node, 'source', ['kind', 'amplitude', 'initialLevel', 'levelTolerance']);
    const unit = topology === 'series' ? 'V' : 'A';
    const amplitude = measure(node.amplitude, 'source.amplitude', unit);
    if (amplitude === 0) throw new DesignError('source.amplitude', 'must not be zero (a step of nothing)');
    const initialLevel = node.initialLevel === undefined ? 0 : measure(node.initialLevel, 'source.initialLevel', unit);
    return { kind, amplitude, initialLevel, ...levelTolerance };
  }
  allowOnly(node, 'source', ['kind', 'capacitorVoltage', 'inductorCurrent', 'levelTolerance']);
  const capacitorVoltage = node.capacitorVoltage === undefined ? 0 : measure(node.capacitorVoltage, 'source.capacitorVoltage', 'V');
  const inductorCurrent = node.inductorCurrent === undefined ? 0 : measure(node.inductorCurrent, 'source.inductorCurrent', 'A');
  if (capacitorVoltage === 0 && inductorCurrent === 0) {
    throw new DesignError('source', 'a natural response needs a capacitorVoltage or an inductorCurrent other than zero');
  }
  return { kind, capacitorVoltage, inductorCurrent, ...levelTolerance };
}

/** Limits per quantity: each an object with a lower and/or an upper limit, not negative, lower below upper. */
function readLimits(value: unknown): Partial<Record<LimitedQuantity, QuantityLimits>> {
  const node = object(value, 'limits');
  allowOnly(node, 'limits', LIMITED_QUANTITIES);
  const result: Partial<Record<LimitedQuantity, QuantityLimits>> = {};
  for (const name of LIMITED_QUANTITIES) {
    if (node[name] === undefined) continue;
    const path = `limits.${name}`;
    const spec = object(node[name], path);
    allowOnly(spec, path, ['lower', 'upper']);
    const side = (key: 'lower' | 'upper'): number | null => {
      if (spec[key] === undefined || spec[key] === null) return null;
      const v = name === 'overshoot' ? percent(spec[key], `${path}.${key}`) : measure(spec[key], `${path}.${key}`, LIMIT_UNITS[name]);
      if (v < 0) throw new DesignError(`${path}.${key}`, `must not be negative, got ${v}`);
      return v;
    };
    const limits = { lower: side('lower'), upper: side('upper') };
    if (limits.lower === null && limits.upper === null) throw new DesignError(path, 'needs a lower or an upper limit (or both)');
    if (limits.lower !== null && limits.upper !== null && !(limits.lower < limits.upper)) {
      throw new DesignError(path, `lower (${limits.lower}) must be below upper (${limits.upper})`);
    }
    result[name] = limits;
  }
  return result;
}

/** The step metrics a design may limit: a natural response (no step) has none of them. */
const STEP_METRICS: readonly LimitedQuantity[] = ['overshoot', 'settlingTime2', 'settlingTime5'];

/**
 * Limits a verdict can decide: one ring gives alpha and omega0, so two of R, L and C with the third taken at its
 * design value, and the step metrics need a step. A limit no capture could decide would pass unchecked.
 */
function checkLimitsDecidable(limits: Partial<Record<LimitedQuantity, QuantityLimits>>, source: DesignSource): Partial<Record<LimitedQuantity, QuantityLimits>> {
  if (limits.R && limits.L && limits.C) {
    throw new DesignError('limits', 'limits R, L and C: one ring gives two of them with the third taken at its design value, so a design may limit at most two');
  }
  const stepMetric = STEP_METRICS.find((name) => limits[name]);
  if (stepMetric && source.kind !== 'step') {
    throw new DesignError(`limits.${stepMetric}`, 'needs a step source (source.kind "step"): a natural response has no step to overshoot or settle');
  }
  return limits;
}

/** A percentage: a number (25 = 25 %) or a text with an optional '%' ('25 %'). */
function percent(value: unknown, path: string): number {
  const n = typeof value === 'string' && /^\s*[+-]?[\d.]+(e[+-]?\d+)?\s*%?\s*$/i.test(value) ? Number(value.replace('%', '').trim()) : value;
  if (typeof n !== 'number' || !Number.isFinite(n)) throw new DesignError(path, "must be a percentage of the step, a number or a text such as '25 %'");
  return n;
}

/**
 * The least coverage factor a design may state: below 1 the interval value ± U covers less than about 68 % and the
 * guard band shrinks below one standard uncertainty; 0.95 there is the coverage probability written for k (GUM 6.2, 6.3).
 */
const MIN_COVERAGE_FACTOR = 1;

/**
 * The widest guard band guarded rejection may take, as a multiple of U: it accepts values up to w beyond a limit, and
 * beyond U that takes in the fail zone, where the measurement proves the unit out of tolerance (ISO 14253-1:2017).
 */
const MAX_REJECTION_GUARD_BAND = 1;

/** The decision rule: its name, and for the guarded rules the guard band factor; the coverage factor k. */
function readDecisionRule(value: unknown): DecisionRuleSpec {
  const node = object(value, 'decisionRule');
  allowOnly(node, 'decisionRule', ['name', 'guardBandFactor', 'coverageFactor']);
  const rule: DecisionRuleSpec = { name: oneOf(node.name, 'decisionRule.name', DECISION_RULE_NAMES) };
  if (node.guardBandFactor !== undefined) {
    const w = node.guardBandFactor;
    if (typeof w !== 'number' || !Number.isFinite(w) || w < 0) throw new DesignError('decisionRule.guardBandFactor', 'must be a number, 0 or more (the guard band as a multiple of U; 1 = U)');
    if (rule.name === 'simple-acceptance' && w !== 0) throw new DesignError('decisionRule.guardBandFactor', 'simple-acceptance has no guard band (w = 0): leave it out or choose a guarded rule');
    if (rule.name === 'guarded-rejection' && w > MAX_REJECTION_GUARD_BAND) {
      throw new DesignError(
        'decisionRule.guardBandFactor',
        'must be at most 1 under guarded-rejection: a guard band wider than U would accept a unit whose whole interval lies outside the limits (proven out of tolerance)',
      );
    }
    rule.guardBandFactor = w;
  }
  if (node.coverageFactor !== undefined) {
    const k = node.coverageFactor;
    if (typeof k !== 'number' || !Number.isFinite(k) || !(k >= MIN_COVERAGE_FACTOR)) {
      throw new DesignError('decisionRule.coverageFactor', 'must be a number, 1 or more (k in U = k u: 2 for about 95 %, not the coverage probability 0.95)');
    }
    rule.coverageFactor = k;
  }
  return rule;
}

/** A relative tolerance: a number in [0, 1). */
function fraction(value: unknown, path: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0 || value >= 1) {
    throw new DesignError(path, 'must be a number between 0 and 1 (0.05 = 5 %)');
  }
  return value;
}

function object(value: unknown, path: string): Json {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new DesignError(path, path === '' ? 'must be a JSON object' : 'must be an object');
  }
  return value as Json;
}

function allowOnly(node: Json, path: string, keys: readonly string[]): void {
  for (const key of Object.keys(node)) {
    if (!keys.includes(key)) {
      const at = path === '' ? key : `${path}.${key}`;
      throw new DesignError(at, `unknown field (expected one of ${keys.join(', ')})`);
    }
  }
}

function text(value: unknown, path: string, allowEmpty = false): string {
  if (typeof value !== 'string' || (!allowEmpty && value.trim() === '')) throw new DesignError(path, 'must be a non-empty string');
  return value;
}

function oneOf<T extends string>(value: unknown, path: string, options: readonly T[]): T {
  if (typeof value !== 'string' || !options.includes(value as T)) {
    throw new DesignError(path, `must be one of ${options.map((o) => `"${o}"`).join(', ')}`);
  }
  return value as T;
}

/** A number, or a string with an optional SI prefix and unit, in SI base units. */
function measure(value: unknown, path: string, unit: string): number {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new DesignError(path, 'must be a finite number');
    return value;
  }
  if (typeof value === 'string') {
    try {
      return parseQuantityText(value, unit);
    } catch (e) {
      throw new DesignError(path, `could not read ${quotedValue(value)} as a value in ${unit} (${(e as Error).message})`);
    }
  }
  throw new DesignError(path, value === undefined ? 'is missing' : `must be a number or a text such as '4.7u' (${unit})`);
}
