// componentsFromResponse: recovery of R, L, C for each topology and known part, and its uncertainties.
import { describe, expect, it } from 'vitest';
import { componentsFromResponse, type Topology } from '../../core/circuit/components';
import { CircuitInputError } from '../../core/circuit/errors';
import { createRandom } from '../../core/random';
import { quantity } from '../../core/quantity';

type Name = 'R' | 'L' | 'C';
const BOARDS: { topology: Topology; R: number; L: number; C: number }[] = [
  { topology: 'series', R: 0.5, L: 15e-9, C: 220e-12 }, // buck switch node loop
  { topology: 'series', R: 220, L: 50e-6, C: 10e-9 }, // overdamped jig
  { topology: 'parallel', R: 330, L: 47e-6, C: 10e-9 }, // test tank
  { topology: 'parallel', R: 1, L: 10e-6, C: 1e-6 },
];

function responseOf(b: (typeof BOARDS)[number]): { alpha: number; omega0: number } {
  // Series alpha = R / (2L), parallel alpha = 1 / (2RC), omega0 = 1 / sqrt(LC) (derived, circuit laws).
  const alpha = b.topology === 'series' ? b.R / (2 * b.L) : 1 / (2 * b.R * b.C);
  return { alpha, omega0: 1 / Math.sqrt(b.L * b.C) };
}

describe('componentsFromResponse', () => {
  const cases = BOARDS.flatMap((b) => (['R', 'L', 'C'] as Name[]).map((known) => ({ ...b, known })));
  it.each(cases)('$topology R=$R L=$L C=$C, known $known: recovers the other two', (c) => {
    const { alpha, omega0 } = responseOf(c);
    const out = componentsFromResponse(quantity(alpha, 0, 's^-1'), quantity(omega0, 0, 'rad/s'), c.topology, { name: c.known, value: c[c.known] });
    for (const n of ['R', 'L', 'C'] as Name[]) {
      expect(out[n].value / c[n] - 1).toBeCloseTo(0, 12);
      expect(out[n].stderr).toBe(0);
    }
    expect([out.R.unit, out.L.unit, out.C.unit]).toEqual(['ohm', 'H', 'F']);
  });

  it('reads a tolerance as a rectangular half-width: u = tol / sqrt(3) (JCGM 100:2008, 4.3.7)', () => {
    const b = BOARDS[0];
    const { alpha, omega0 } = responseOf(b);
    const out = componentsFromResponse(quantity(alpha, 0, 's^-1'), quantity(omega0, 0, 'rad/s'), 'series', { name: 'L', value: b.L, tolerance: 0.05 });
    // R = 2 alpha L and C = 1 / (omega0^2 L): both carry L's relative uncertainty once.
    expect(out.L.stderr! / out.L.value).toBeCloseTo(0.05 / Math.sqrt(3), 12);
    expect(out.R.stderr! / out.R.value).toBeCloseTo(0.05 / Math.sqrt(3), 12);
    expect(out.C.stderr! / out.C.value).toBeCloseTo(0.05 / Math.sqrt(3), 12);
  });

  // Monte Carlo of the exact relations (normal alpha, omega0 with correlation, uniform known part)
  // against the first-order propagation; small uncertainties so first order holds.
  const mcCases = [
    { board: 0, known: 'L' as Name, rho: 0.6 },
    { board: 1, known: 'R' as Name, rho: -0.4 },
    { board: 2, known: 'C' as Name, rho: 0.3 },
    { board: 3, known: 'L' as Name, rho: 0 },
    { board: 2, known: 'R' as Name, rho: 0.9 },
  ];
  it.each(mcCases)('first-order stderr matches a seeded Monte Carlo (board $board, known $known, rho $rho)', ({ board, known, rho }) => {
    const b = BOARDS[board];
    const { alpha, omega0 } = responseOf(b);
    const ua = 2e-3 * alpha;
    const uw = 1e-3 * omega0;
    const tol = 0.01;
    const out = componentsFromResponse(quantity(alpha, ua, 's^-1'), quantity(omega0, uw, 'rad/s'), b.topology, { name: known, value: b[known], tolerance: tol }, rho);
    const random = createRandom(20240 + board);
    const draws = 20000;
    const sums: Record<Name, [number, number]> = { R: [0, 0], L: [0, 0], C: [0, 0] };
    for (let k = 0; k < draws; k++) {
      const z1 = random.normal();
      const z2 = rho * z1 + Math.sqrt(1 - rho * rho) * random.normal();
      const a = alpha + ua * z1;
      const w = omega0 + uw * z2;
      const kv = b[known] * (1 + tol * (2 * random.uniform() - 1));
      const r = componentsFromResponse(quantity(a, 0, 's^-1'), quantity(w, 0, 'rad/s'), b.topology, { name: known, value: kv });
      for (const n of ['R', 'L', 'C'] as Name[]) {
        sums[n][0] += r[n].value;
        sums[n][1] += r[n].value ** 2;
      }
    }
    for (const n of ['R', 'L', 'C'] as Name[]) {
      const mean = sums[n][0] / draws;
      const sd = Math.sqrt(sums[n][1] / draws - mean * mean);
      expect(out[n].stderr! / sd).toBeGreaterThan(0.97);
      expect(out[n].stderr! / sd).toBeLessThan(1.03);
    }
  });

  it('gives a null stderr only where a null alpha or omega0 stderr enters', () => {
    const b = BOARDS[0];
    const { alpha, omega0 } = responseOf(b);
    // Series, L known: C = 1 / (omega0^2 L) needs no alpha; R = 2 alpha L does.
    const out = componentsFromResponse(quantity(alpha, null, 's^-1'), quantity(omega0, 1e3, 'rad/s'), 'series', { name: 'L', value: b.L });
    expect(out.R.stderr).toBeNull();
    expect(out.C.stderr).not.toBeNull();
  });

  const invalid: { label: string; alpha: number; omega0: number; known: { name: Name; value: number; tolerance?: number }; field: string }[] = [
    { label: 'zero known value', alpha: 1e6, omega0: 1e8, known: { name: 'L', value: 0 }, field: 'known.value' },
    { label: 'negative known value', alpha: 1e6, omega0: 1e8, known: { name: 'C', value: -1e-9 }, field: 'known.value' },
    { label: 'NaN known value', alpha: 1e6, omega0: 1e8, known: { name: 'R', value: NaN }, field: 'known.value' },
    { label: 'infinite known value', alpha: 1e6, omega0: 1e8, known: { name: 'R', value: Infinity }, field: 'known.value' },
    { label: 'tolerance above 1', alpha: 1e6, omega0: 1e8, known: { name: 'R', value: 1, tolerance: 1.5 }, field: 'known.tolerance' },
    { label: 'growing response', alpha: -1e6, omega0: 1e8, known: { name: 'L', value: 1e-9 }, field: 'alpha' },
    { label: 'lossless fit', alpha: 0, omega0: 1e8, known: { name: 'L', value: 1e-9 }, field: 'alpha' },
    { label: 'zero omega0', alpha: 1e6, omega0: 0, known: { name: 'L', value: 1e-9 }, field: 'omega0' },
  ];
  it.each(invalid)('throws CircuitInputError naming $field for a $label', ({ alpha, omega0, known, field }) => {
    const call = () => componentsFromResponse(quantity(alpha, 0, 's^-1'), quantity(omega0, 0, 'rad/s'), 'series', known);
    expect(call).toThrow(CircuitInputError);
    expect(call).toThrow(new RegExp(`^${field.replace('.', '\\.')}:`));
  });
});
