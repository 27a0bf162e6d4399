// What every report face shows for one measurement: the fitted rows, margins and times as text.

import type { Quantity } from '../quantity';
import type { FitSummary } from './fitSummary';
import type { VerdictQuantity } from '../circuit/verdict';

export interface ResultRow {
  label: string;
  quantity: Quantity;
}

/** alpha, omega0, omega_d, f0, zeta, Q, final value, t0, then R, L, C when derived. */
export function fitResultRows(fit: FitSummary): ResultRow[] {
  const rows: ResultRow[] = [
    { label: 'alpha', quantity: fit.alpha },
    { label: 'omega0', quantity: fit.omega0 },
  ];
  if (fit.omegaD) rows.push({ label: 'omega_d', quantity: fit.omegaD });
  rows.push(
    { label: 'f0', quantity: hertz(fit.omega0) },
    { label: 'zeta', quantity: fit.zeta },
    { label: 'Q', quantity: fit.Q },
    { label: 'final value', quantity: fit.finalValue },
    { label: 't0', quantity: fit.t0 },
  );
  if (fit.components) {
    rows.push(
      { label: 'R', quantity: fit.components.R },
      { label: 'L', quantity: fit.components.L },
      { label: 'C', quantity: fit.components.C },
    );
  }
  return rows;
}

/** f = omega / (2 pi), Hz. */
export function hertz(omega: Quantity): Quantity {
  const k = 1 / (2 * Math.PI);
  return { value: omega.value * k, stderr: omega.stderr === null ? null : omega.stderr * k, unit: 'Hz' };
}

/** 'margin 1.3 sigma' style text for a verdict quantity. */
export function marginText(q: VerdictQuantity): string {
  return Number.isFinite(q.marginSigma) ? `${q.marginSigma.toFixed(2)} σ` : '∞ σ';
}

/** '2025-03-14 09:26:53 UTC' from an ISO time; the text as given when it is not one. */
export function showTime(iso: string): string {
  const ms = Date.parse(iso);
  return Number.isNaN(ms) ? iso : `${new Date(ms).toISOString().slice(0, 19).replace('T', ' ')} UTC`;
}
