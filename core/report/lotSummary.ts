// The lot: first-pass and final yield, per-quantity statistics with Cp and Cpk and decision zones,
// failures by likely cause, and the units that failed or fell in a conditional zone.

import type { Verdict, VerdictQuantity } from '../circuit/verdict';
import type { DecisionRule, DecisionZone } from '../circuit/decisionRule';
import type { BenchRecord } from './benchRecord';
import { processCapability, sampleStatistics, type Capability, type Limits, type SampleStatistics } from './capability';
import { histogramOf, type Histogram } from './histogram';

/** The fields guard-banded decisions added to a verdict row: records logged before them carry none. */
type ZoneFields = 'zone' | 'limits' | 'limitsFrom' | 'expandedUncertainty' | 'counted';
type LoggedQuantity = Omit<VerdictQuantity, ZoneFields> & Partial<Pick<VerdictQuantity, ZoneFields>>;
type LoggedVerdict = Omit<Verdict, 'decision' | 'rule' | 'quantities'> & Partial<Pick<Verdict, 'decision' | 'rule'>> & { quantities: LoggedQuantity[] };

export interface LotQuantity {
  name: string;
  unit: string;
  /** The design's value (of the first unit carrying the quantity). */
  design: number;
  /** Limits in SI units, null when the verdicts give none (Cp and Cpk are then not defined). */
  limits: Limits | null;
  /** The quantity enters the units' decisions (false for a derived part the design does not limit: diagnosis only). */
  counted: boolean;
  /** Null when no unit has a finite value. */
  stats: SampleStatistics | null;
  capability: Capability;
  /** Units in each decision zone. */
  zones: Record<DecisionZone, number>;
  /** The units' final values, in unit order. */
  values: number[];
  histogram: Histogram | null;
}

/** One design's units and quantities (a lot measured against two designs is two groups). */
export interface LotGroup {
  design: string;
  units: number;
  quantities: LotQuantity[];
}

export interface LotUnit {
  unit: string;
  measurements: number;
  /** The first checked measurement was accepted. */
  firstPass: boolean;
  /** The latest checked measurement was accepted. */
  finalPass: boolean;
  /** Zone of the latest checked measurement. */
  decision: DecisionZone;
  design: string;
  /** Counted quantities of the latest checked measurement outside the pass zone, with their zone. */
  outside: { name: string; zone: DecisionZone }[];
  /** The verdict's likely cause in words ('R about 29.0 % high'), or null. */
  likelyCause: string | null;
  /** The latest checked record's id. */
  recordId: string;
}

export interface CauseBin {
  /** A component, 'source', or NO_CAUSE. */
  cause: string;
  units: string[];
}

export interface YieldFigure {
  count: number;
  /** count / checked units in percent; null when no unit was checked. */
  percent: number | null;
}

export interface LotSummary {
  measurements: number;
  checkedUnits: number;
  notCheckedUnits: number;
  firstPass: YieldFigure;
  final: YieldFigure;
  /** Units in each decision zone at their latest checked measurement. */
  zones: Record<DecisionZone, number>;
  groups: LotGroup[];
  /** Units not accepted at their latest measurement, binned by the likely cause their verdict names, largest bin first. */
  causes: CauseBin[];
  /** Units that failed or fell in a conditional zone at their latest measurement, or failed first. */
  flagged: LotUnit[];
  /** The decision rules the latest verdicts name; empty when they predate guard-banded decisions. */
  rules: DecisionRule[];
  /** Where the lot needs a word of care (limits that differ between units of one design). */
  notes: string[];
}

/** Bin of failures whose verdict names no likely cause. */
export const NO_CAUSE = 'none named';

/** Stated beside the yields. */
export const LOT_YIELD_RULE =
  "First-pass yield: units whose first measurement checked against a design was accepted; final yield: units whose latest one was. Both over the units checked; statistics, zones and failures are of each unit's latest checked measurement. Records logged before decision zones are read as pass (in tolerance) or fail.";

/** Units in the order they first appear in `records` (give records in time order). */
export function summarizeLot(records: readonly BenchRecord[]): LotSummary {
  const byUnit = new Map<string, BenchRecord[]>();
  for (const record of records) byUnit.set(record.unit, [...(byUnit.get(record.unit) ?? []), record]);
  const units: LotUnit[] = [];
  const finals: { unit: string; record: BenchRecord }[] = [];
  let notCheckedUnits = 0;
  for (const [unit, list] of byUnit) {
    const checked = list.filter((r) => r.verdict !== null);
    if (!checked.length) {
      notCheckedUnits++;
      continue;
    }
    const latest = checked[checked.length - 1];
    finals.push({ unit, record: latest });
    units.push(lotUnit(unit, list.length, checked[0], latest));
  }
  const zones = countZones(units.map((u) => u.decision));
  const rules = distinctRules(finals.map((f) => loggedVerdict(f.record).rule ?? null));
  const notes: string[] = [];
  return {
    measurements: records.length,
    checkedUnits: units.length,
    notCheckedUnits,
    firstPass: yieldOf(units.filter((u) => u.firstPass).length, units.length),
    final: yieldOf(units.filter((u) => u.finalPass).length, units.length),
    zones,
    groups: groupByDesign(finals, notes),
    causes: binCauses(finals.filter((f) => !f.record.verdict!.pass)),
    flagged: units.filter((u) => !u.firstPass || u.decision !== 'pass' || !u.finalPass),
    rules,
    notes,
  };
}

/** The zone of a verdict quantity; before decision zones, in tolerance is pass and out is fail. */
export function quantityZone(q: LoggedQuantity): DecisionZone {
  return q.zone ?? (q.inTolerance ? 'pass' : 'fail');
}

/** The unit's zone by its verdict; before decision zones, pass or fail. */
export function verdictDecision(verdict: LoggedVerdict): DecisionZone {
  return verdict.decision ?? (verdict.pass ? 'pass' : 'fail');
}

/** A record's verdict as logged, whatever version logged it (null-checked by the caller). */
function loggedVerdict(record: BenchRecord): LoggedVerdict {
  return record.verdict as LoggedVerdict;
}

/** 'R about 29.0 % high', or null when the verdict names no cause. */
export function likelyCauseText(verdict: Verdict): string | null {
  const c = verdict.likelyCause;
  if (!c) return null;
  return `${c.component} about ${(Math.abs(c.change) * 100).toFixed(1)} % ${c.change >= 0 ? 'high' : 'low'}`;
}

function lotUnit(unit: string, measurements: number, first: BenchRecord, latest: BenchRecord): LotUnit {
  const verdict = loggedVerdict(latest);
  return {
    unit,
    measurements,
    firstPass: first.verdict!.pass,
    finalPass: verdict.pass,
    decision: verdictDecision(verdict),
    design: latest.design?.name ?? 'design',
    outside: verdict.quantities
      .filter((q) => q.counted !== false)
      .map((q) => ({ name: q.name, zone: quantityZone(q) }))
      .filter((q) => q.zone !== 'pass'),
    likelyCause: likelyCauseText(latest.verdict!),
    recordId: latest.id,
  };
}

function yieldOf(count: number, checked: number): YieldFigure {
  return { count, percent: checked > 0 ? (100 * count) / checked : null };
}

function countZones(zones: readonly DecisionZone[]): Record<DecisionZone, number> {
  const counts = { pass: 0, 'conditional-pass': 0, 'conditional-fail': 0, fail: 0 };
  for (const zone of zones) counts[zone]++;
  return counts;
}

/** Groups by the design file's hash (its name shown), quantities in the order the verdicts list them. */
function groupByDesign(finals: readonly { unit: string; record: BenchRecord }[], notes: string[]): LotGroup[] {
  const groups = new Map<string, { design: string; records: BenchRecord[] }>();
  for (const { record } of finals) {
    const key = record.design?.sha256 ?? 'no design file';
    const group = groups.get(key) ?? { design: record.design?.name ?? 'design', records: [] };
    group.records.push(record);
    groups.set(key, group);
  }
  const names = [...groups.values()].map((g) => g.design);
  return [...groups].map(([key, { design, records }]) => {
    // Two versions of a design under one name are told apart by their hash.
    const label = names.filter((n) => n === design).length > 1 ? `${design} (${key.slice(0, 8)})` : design;
    return { design: label, units: records.length, quantities: lotQuantities(label, records, notes) };
  });
}

function lotQuantities(design: string, records: readonly BenchRecord[], notes: string[]): LotQuantity[] {
  const rows = new Map<string, LoggedQuantity[]>();
  for (const record of records) {
    for (const q of loggedVerdict(record).quantities) rows.set(q.name, [...(rows.get(q.name) ?? []), q]);
  }
  return [...rows].map(([name, list]) => {
    const values = list.map((q) => q.measured.value).filter(Number.isFinite);
    const limits = list.find((q) => q.limits)?.limits ?? null;
    if (limits && list.some((q) => q.limits && (q.limits.lower !== limits.lower || q.limits.upper !== limits.upper))) {
      notes.push(`The limits of ${name} differ between units of ${design}: those of the first unit are used.`);
    }
    const stats = sampleStatistics(values);
    const capability: Capability = stats
      ? processCapability(stats, limits)
      : { cp: { value: null, reason: 'no values' }, cpk: { value: null, reason: 'no values' } };
    return {
      name,
      unit: list[0].measured.unit,
      design: list[0].design.value,
      limits,
      counted: list.some((q) => q.counted !== false),
      stats,
      capability,
      zones: countZones(list.map(quantityZone)),
      values,
      histogram: histogramOf(values),
    };
  });
}

function binCauses(failed: readonly { unit: string; record: BenchRecord }[]): CauseBin[] {
  const bins = new Map<string, string[]>();
  for (const { unit, record } of failed) {
    const cause = record.verdict!.likelyCause?.component ?? NO_CAUSE;
    bins.set(cause, [...(bins.get(cause) ?? []), unit]);
  }
  return [...bins].map(([cause, units]) => ({ cause, units })).sort((a, b) => b.units.length - a.units.length);
}

function distinctRules(rules: readonly (DecisionRule | null)[]): DecisionRule[] {
  const seen = new Map<string, DecisionRule>();
  for (const rule of rules) if (rule) seen.set(JSON.stringify(rule), rule);
  return [...seen.values()];
}
