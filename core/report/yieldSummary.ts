// Pass, fail and not-checked per unit across a bench log, and the yield.

import type { BenchRecord } from './benchRecord';

export type UnitStatus = 'pass' | 'fail' | 'not checked';

export interface UnitSummary {
  unit: string;
  /** The unit's measurements in the order logged. */
  records: BenchRecord[];
  /** Verdict of the latest measurement checked against a design; 'not checked' when none was. */
  status: UnitStatus;
  /** Design name of that measurement, or null. */
  design: string | null;
}

export interface YieldSummary {
  units: UnitSummary[];
  pass: number;
  fail: number;
  notChecked: number;
  /** pass / (pass + fail) in percent; null when no unit was checked. */
  yieldPercent: number | null;
}

/** Rule stated in every report beside the yield table. */
export const YIELD_RULE =
  "A unit's status is the verdict of its latest measurement checked against a design; yield is pass / (pass + fail), units not checked left out.";

/** Units in the order they first appear in the log. */
export function summarizeYield(records: readonly BenchRecord[]): YieldSummary {
  const byUnit = new Map<string, BenchRecord[]>();
  for (const record of records) {
    const list = byUnit.get(record.unit);
    if (list) list.push(record);
    else byUnit.set(record.unit, [record]);
  }
  const units: UnitSummary[] = [...byUnit].map(([unit, list]) => {
    const checked = [...list].reverse().find((r) => r.verdict !== null);
    return {
      unit,
      records: list,
      status: checked ? (checked.verdict!.pass ? 'pass' : 'fail') : 'not checked',
      design: checked?.design?.name ?? null,
    };
  });
  const count = (status: UnitStatus) => units.filter((u) => u.status === status).length;
  const pass = count('pass');
  const fail = count('fail');
  return { units, pass, fail, notChecked: count('not checked'), yieldPercent: pass + fail > 0 ? (100 * pass) / (pass + fail) : null };
}

/** The verdict of one measurement as a status word. */
export function recordStatus(record: BenchRecord): UnitStatus {
  return record.verdict === null ? 'not checked' : record.verdict.pass ? 'pass' : 'fail';
}
