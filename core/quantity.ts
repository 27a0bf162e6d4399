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

/**
 * A value within this many standard uncertainties of zero has no relative uncertainty worth showing: its sign is not
 * established at about 95 % (the coverage factor of GUM 6.3.3), and u/|x| then says more about the zero than about
 * the measurement ('-120 µA ± 780 µA (670 %)' for a ringdown's final level).
 */
const RELATIVE_FROM_ZERO = 2;

/** Relative standard uncertainty u/|x|, or null when unknown, when x is zero or within RELATIVE_FROM_ZERO u of zero. */
export function relativeUncertainty(q: Quantity): number | null {
  if (q.stderr === null || !Number.isFinite(q.stderr) || !Number.isFinite(q.value) || q.value === 0) return null;
  if (!(Math.abs(q.value) >= RELATIVE_FROM_ZERO * q.stderr)) return null;
  return q.stderr / Math.abs(q.value);
}
