// A measured or derived value with its standard uncertainty, in SI base units.

export interface Quantity {
  value: number;
  /** One standard uncertainty (1 sigma); null when it could not be estimated. */
  stderr: number | null;
  /** SI unit symbol ('s^-1', 'rad/s', 'V', 'A', 'ohm', 'H', 'F', 's', '' for ratios). */
  unit: string;
}

export function quantity(value: number, stderr: number | null, unit: string): Quantity {
  const err = stderr === null || !Number.isFinite(stderr) ? null : Math.abs(stderr);
  return { value, stderr: err, unit };
}

/** Relative standard uncertainty, or null when unknown or the value is zero. */
export function relativeUncertainty(q: Quantity): number | null {
  if (q.stderr === null || q.value === 0) return null;
  return Math.abs(q.stderr / q.value);
}
