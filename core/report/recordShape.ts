// The one deep check of a measurement record: every field the log table and the reports read, from a log line or a window's request.

import { importSummaryProblem } from './importSummaryShape';
import { isCount, isObject, isText, MAX_WARNING, type Json } from './jsonShape';
import { RESULT_ROWS, TRANSITION_ROWS, valueAtPath, type ResultRowSpec } from './resultRows';
import { fitSucceeded } from './fitSummary';
import type { FitStatus } from '../fit/types';
import type { Regime } from '../fit/responseFit';

/** What is wrong and where: `field` is the dotted path of the part checked ('fit.import', 'cautions.fired[0]'), `problem` a phrase. */
export interface ShapeProblem {
  field: string;
  problem: string;
}

/** Longest note kept in a log line: the command line never limited it, so only what is plainly not a note is refused. */
const MAX_NOTE = 1024 * 1024;
/** Longest path accepted (PATH_MAX on Linux). */
export const MAX_PATH = 4096;
/** Longest unit symbol of a quantity ('s^-1', 'rad/s'); anything longer is not a unit. */
const MAX_UNIT = 16;

/** Every status a fit can end in, and every regime a converged fit can have ('none' is a failed fit's), as records so that a new one fails to compile until it is listed here. */
const FIT_STATUSES = Object.keys({ converged: true, 'max-iterations': true, failed: true, 'no-response': true } satisfies Record<FitStatus, true>);
const REGIMES = Object.keys({ underdamped: true, 'critically damped': true, overdamped: true, 'first-order': true } satisfies Record<Exclude<Regime, 'none'>, true>);
/** The quantities a fit summary stores (derived rows such as f0 are not stored), from the one row table. */
const FIT_QUANTITY_ROWS: readonly ResultRowSpec[] = RESULT_ROWS.filter((row: ResultRowSpec) => !row.derived);
const PARAM_NAMES = ['t0', 'yPre', 'yFinal', 'alpha', 'omega0', 'a', 'b'];
const SETTING_TEXTS = ['topology', 'known', 'column', 'sampleInterval', 'from', 'to'];
/** Settings left out when not given (and by records of earlier versions). */
const OPTIONAL_SETTING_TEXTS = ['timeUnit', 'valueUnit', 'segment', 'probeRatio', 'event', 'modes', 'mode', 'scopeBandwidth', 'probeCapacitance', 'groundLead'];

/**
 * The first thing wrong with the measured part of a record (unit ... cautions), or null. The same
 * check for a line of the log and a window's request, so that nothing a report cannot show is kept.
 */
export function measurementShapeProblem(value: Json): ShapeProblem | null {
  if (!isText(value.unit) || value.unit.trim() === '') return at('unit', 'the unit under test needs a name or serial number (text, at most 2000 characters)');
  if (value.operator !== null && !isText(value.operator)) return at('operator', 'must be text or null');
  if (value.station !== undefined && !isText(value.station)) return at('station', 'must be text when given');
  if (value.note !== null && !isText(value.note, MAX_NOTE)) return at('note', 'must be text or null');
  const capture = value.capture;
  if (!isObject(capture) || !isText(capture.path, MAX_PATH) || !isText(capture.channel) || !isSha256(capture.sha256) || !isCount(capture.bytes)) {
    return at('capture', 'must give path, channel, sha256 (64 hex digits) and bytes');
  }
  if (!isSettings(value.settings)) {
    return at('settings', 'must give topology, known, column, sampleInterval, from, to (text or null) and sortTime, and timeUnit, valueUnit, segment, probeRatio, event, modes, mode, scopeBandwidth, probeCapacitance, groundLead only as text, invert and jumpStart only as true or false');
  }
  const fit = fitSummaryProblem(value.fit);
  if (fit) return nested('fit', fit);
  const verdict = value.verdict === null ? null : verdictProblem(value.verdict);
  if (verdict) return at('verdict', verdict);
  const design = value.design;
  if (design !== null && (!isObject(design) || !isText(design.path, MAX_PATH) || !isText(design.name) || !isSha256(design.sha256) || !isObject(design.spec))) {
    return at('design', 'must give path, name, sha256 and spec, or be null');
  }
  return cautionsProblem(value.cautions) ?? setupChecksProblem(value.setupChecks);
}

/** The setup checks, when kept: each an id, a level (note, warning, refusal) and a one-line message; values an object when given. */
function setupChecksProblem(value: unknown): ShapeProblem | null {
  if (value === undefined) return null;
  if (!Array.isArray(value)) return at('setupChecks', 'must be a list of setup checks when given');
  for (const [i, c] of value.entries()) {
    const ok = isObject(c) && isText(c.id) && ['note', 'warning', 'refusal'].includes(c.level as string) && isText(c.message) && (c.values === undefined || isObject(c.values));
    if (!ok) return at(`setupChecks[${i}]`, 'must give id, level (note, warning or refusal) and message, and values only as an object');
  }
  return null;
}

function at(field: string, problem: string): ShapeProblem {
  return { field, problem };
}

function nested(prefix: string, inner: ShapeProblem | string): ShapeProblem {
  return typeof inner === 'string' ? at(prefix, inner) : at(`${prefix}.${inner.field}`, inner.problem);
}

function fitSummaryProblem(value: unknown): ShapeProblem | string | null {
  if (!isObject(value)) return 'must be a fit summary (status, alpha, omega0, ...)';
  if (!isText(value.file, MAX_PATH) || !isText(value.channel)) return 'file and channel must be text';
  if (!FIT_STATUSES.includes(value.status as string)) return `status must be one of ${FIT_STATUSES.join(', ')}`;
  if (!isText(value.message, MAX_WARNING)) return 'message must be text';
  if (!fitSucceeded({ status: value.status as FitStatus })) {
    if (value.regime !== undefined || value.regimeEvidence !== undefined) return 'a fit that did not converge has no regime';
  } else if (!REGIMES.includes(value.regime as string) || !isText(value.regimeEvidence, MAX_WARNING)) {
    return `regime must be one of ${REGIMES.join(', ')}, with its evidence`;
  }
  for (const row of FIT_QUANTITY_ROWS) {
    const field = valueAtPath(value, row.name);
    // R, L and C come together: optional as a set, each required once components are given.
    const absent = row.optional === 'components' ? value.components === undefined : row.optional !== undefined && field === undefined;
    if (absent) continue;
    if (!isQuantity(field)) return `${row.name} must be a quantity { value, stderr, unit }`;
  }
  if (value.components !== undefined && (!isObject(value.components) || !isText(value.components.topology) || !isText(value.components.known))) {
    return 'components must give topology and known with R, L and C';
  }
  if (value.preLevel !== undefined && !isQuantity(value.preLevel)) return 'preLevel must be a quantity { value, stderr, unit }';
  if (value.startsInResponse !== undefined && value.startsInResponse !== true) return 'startsInResponse must be true where given';
  const modes = modesProblem(value);
  if (modes) return modes;
  if (!isNumberOrNull(value.rmsResidual) || !isNumberOrNull(value.noiseRms)) return 'rmsResidual and noiseRms must be numbers';
  if (!isCount(value.samplesUsed)) return 'samplesUsed must be a count';
  if (!isObject(value.window) || !isNumberOrNull(value.window.start) || !isNumberOrNull(value.window.end)) return 'window must give start and end';
  if (value.params !== undefined && !(isObject(value.params) && PARAM_NAMES.every((name) => isNumberOrNull((value.params as Json)[name])))) {
    return `params must give ${PARAM_NAMES.join(', ')} as numbers`;
  }
  if (!isTextList(value.warnings, MAX_WARNING)) return 'warnings must be a list of text';
  const transitions = value.transitions === undefined ? null : transitionsProblem(value.transitions);
  if (transitions) return transitions;
  const imported = value.import === undefined ? null : importSummaryProblem(value.import);
  return imported ? at('import', imported) : null;
}

/** Quantities every ringing mode gives (omegaD too, or null where the mode does not ring). */
const MODE_QUANTITIES = ['alpha', 'omega0', 'zeta', 'Q', 'amplitude'];

/** The ringing modes, the slow term, the order table and the mode R, L and C are for, each checked where given (older records have none). */
function modesProblem(value: Json): string | null {
  if (value.modes !== undefined) {
    if (!Array.isArray(value.modes)) return 'modes must be a list';
    const bad = value.modes.findIndex(
      (m) => !(isObject(m) && MODE_QUANTITIES.every((name) => isQuantity(m[name])) && (m.omegaD === null || isQuantity(m.omegaD)) && isNumberOrNull(m.energyShare)),
    );
    if (bad >= 0) return `modes[${bad}] must give ${MODE_QUANTITIES.join(', ')} and omegaD as quantities, and energyShare`;
  }
  const slow = value.slowTerm;
  if (slow !== undefined && !(isObject(slow) && isQuantity(slow.tau) && isQuantity(slow.amplitude))) return 'slowTerm must give tau and amplitude as quantities';
  const order = value.modelOrder;
  if (order !== undefined && order !== null) {
    if (!isObject(order) || !isText(order.criterion) || typeof order.forced !== 'boolean' || !isText(order.reason, MAX_WARNING) || !Array.isArray(order.table)) {
      return 'modelOrder must give criterion, forced, reason and table, or be null';
    }
    const row = order.table.findIndex(
      (r) => !(isObject(r) && isText(r.model) && isCount(r.ringingModes) && typeof r.slowTerm === 'boolean' && isCount(r.parameters) && isNumberOrNull(r.sse) && isNumberOrNull(r.criterion) && typeof r.chosen === 'boolean'),
    );
    if (row >= 0) return `modelOrder.table[${row}] must give model, ringingModes, slowTerm, parameters, sse, criterion and chosen`;
  }
  const terms = value.modeTerms;
  if (terms !== undefined) {
    const ringOk = (r: unknown) => isObject(r) && ['alpha', 'omega0', 'a', 'b'].every((k) => isNumberOrNull(r[k]));
    const slowOk = (s: unknown) => s === null || (isObject(s) && isNumberOrNull(s.rate) && isNumberOrNull(s.amplitude));
    if (!(isObject(terms) && Array.isArray(terms.rings) && terms.rings.every(ringOk) && slowOk(terms.slow))) {
      return 'modeTerms must give rings (alpha, omega0, a, b) and slow (rate, amplitude) or null';
    }
  }
  const mode = isObject(value.components) ? value.components.mode : undefined;
  if (mode !== undefined && !(isObject(mode) && isCount(mode.index) && isCount(mode.of) && isQuantity(mode.f0))) return 'components.mode must give index, of and f0';
  return null;
}

/** The transition metrics the reports show (the row table's), each a quantity or null from the model, a number or null as measured. */
function transitionsProblem(value: unknown): string | null {
  if (!isObject(value) || !isText(value.levelMethod) || (value.reason !== null && !isText(value.reason, MAX_WARNING))) return 'transitions must give levelMethod and reason';
  for (const row of TRANSITION_ROWS) {
    if (value.model !== null && !(isObject(value.model) && (value.model[row.name] === null || isQuantity(value.model[row.name])))) {
      return `transitions.model.${row.name} must be a quantity or null`;
    }
    if (value.measured !== null && !(isObject(value.measured) && isNumberOrNull(value.measured[row.name]))) return `transitions.measured.${row.name} must be a number or null`;
  }
  if (!isTextList(value.warnings, MAX_WARNING)) return 'transitions.warnings must be a list of text';
  return null;
}

function verdictProblem(value: unknown): string | null {
  if (!isObject(value) || typeof value.pass !== 'boolean') return 'must be a design check result (pass, quantities, notes) or null';
  if (!Array.isArray(value.quantities)) return 'quantities must be a list';
  const bad = value.quantities.findIndex(
    (q) => !(isObject(q) && isText(q.name) && isQuantity(q.design) && isQuantity(q.measured) && isNumberOrNull(q.marginSigma) && typeof q.inTolerance === 'boolean'),
  );
  if (bad >= 0) return `quantities[${bad}] must give name, design, measured, marginSigma and inTolerance`;
  if (!isNumberOrNull(value.rmsDifference ?? null)) return 'rmsDifference must be a number or null';
  const cause = value.likelyCause ?? null;
  if (cause !== null && !(isObject(cause) && isText(cause.component) && isFiniteNumber(cause.change) && isQuantity(cause.impliedValue) && isNumberOrNull(cause.explains))) {
    return 'likelyCause must give component, change, impliedValue and explains, or be null';
  }
  return isTextList(value.notes, MAX_WARNING) ? null : 'notes must be a list of text';
}

function cautionsProblem(value: unknown): ShapeProblem | null {
  if (!isObject(value) || !Array.isArray(value.fired) || !isObject(value.energies)) return at('cautions', 'must list the fired cautions and the energies');
  for (const [i, c] of value.fired.entries()) {
    if (!(isObject(c) && isText(c.id) && isText(c.checks) && isText(c.message, MAX_WARNING) && isText(c.source) && isText(c.certainty))) {
      return at(`cautions.fired[${i}]`, 'must give id, checks, message, source and certainty');
    }
    if (!isQuantity(c.measured) || !isQuantity(c.threshold)) return at(`cautions.fired[${i}]`, 'measured and threshold must be quantities { value, stderr, unit }');
  }
  for (const key of ['capacitor', 'inductor']) {
    if (value.energies[key] !== undefined && !isQuantity(value.energies[key])) return at(`cautions.energies.${key}`, 'must be a quantity { value, stderr, unit }');
  }
  if (value.charge !== undefined && !isQuantity(value.charge)) return at('cautions.charge', 'must be a quantity { value, stderr, unit }');
  const discharge = value.discharge;
  if (discharge !== undefined && !(isObject(discharge) && isQuantity(discharge.time) && isNumberOrNull(discharge.toVoltage))) {
    return at('cautions.discharge', 'must give time (a quantity) and toVoltage');
  }
  return null;
}

function isSettings(value: unknown): boolean {
  if (!isObject(value) || typeof value.sortTime !== 'boolean') return false;
  const given = SETTING_TEXTS.every((key) => value[key] === null || isText(value[key]));
  const stated = OPTIONAL_SETTING_TEXTS.every((key) => value[key] === undefined || isText(value[key]));
  const flags = ['invert', 'jumpStart'].every((key) => value[key] === undefined || typeof value[key] === 'boolean');
  return given && stated && flags;
}

/** JSON turns NaN and Infinity into null, so a number that could not be formed arrives as null. */
function isQuantity(value: unknown): boolean {
  return isObject(value) && isNumberOrNull(value.value) && isNumberOrNull(value.stderr) && typeof value.unit === 'string' && value.unit.length <= MAX_UNIT;
}

function isNumberOrNull(value: unknown): boolean {
  return value === null || typeof value === 'number';
}

function isFiniteNumber(value: unknown): boolean {
  return typeof value === 'number' && Number.isFinite(value);
}

function isSha256(value: unknown): boolean {
  return typeof value === 'string' && /^[0-9a-f]{64}$/.test(value);
}

function isTextList(value: unknown, max: number): boolean {
  return Array.isArray(value) && value.every((item) => isText(item, max));
}
