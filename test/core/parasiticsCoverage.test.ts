// measureParasiticsOutcome over seeded synthetic captures of one loop: the printed L_p, C_p and R_p against the
// handbook relations from the fitted f0, and their stated uncertainties against the spread over seeds.
import { describe, expect, it } from 'vitest';
import type { Channel } from '../../core/capture/types';
import { createRandom } from '../../core/random';
import { evaluateResponse } from '../../core/response/secondOrder';
import { measureParasiticsOutcome } from '../../core/workflow/parasitics';

/** The loop of the switch-node sample: L_p 6.5 nH, C_p 390 pF, R_p 280 mOhm (invented values); 470 pF added. */
const L = 6.5e-9;
const C = 390e-12;
const R = 0.28;
const ADDED = 470e-12;
const STEP = 48;

/** A 48 V step into the series loop with node capacitance c, 2000 samples every 200 ps, 0.5 V noise (seeded): invented data. */
function capture(c: number, seed: number, interval = 0.2e-9): Channel {
  const alpha = R / (2 * L);
  const time = Float64Array.from({ length: 2000 }, (_, i) => i * interval);
  const clean = evaluateResponse({ t0: 40e-9, yPre: 0, yFinal: STEP, a: -STEP, b: -alpha * STEP, alpha, omega0: 1 / Math.sqrt(L * c) }, time);
  const random = createRandom(seed);
  return { name: 'CH1', unit: 'V', time, values: clean.map((v) => v + 0.5 * random.normal()), clipped: new Uint8Array(time.length) } as Channel;
}

function extract(seed: number) {
  const outcome = measureParasiticsOutcome({
    captures: [
      { file: 'bare.csv', channel: capture(C, 1000 + seed), addedC: 0 },
      { file: 'added.csv', channel: capture(C + ADDED, 2000 + seed), addedC: ADDED },
    ],
    // Simulated parts are exact: the coverage tested is the fit's alone.
    addedTolerance: 0,
  });
  if (!outcome.result) throw new Error(outcome.failure);
  return outcome.result;
}

describe('loop parasitics from synthetic captures', () => {
  it('L_p, C_p and R_p are the handbook relations of the two fitted f0 and the bare alpha', () => {
    const r = extract(1);
    const [f1, f2] = r.captures.map((c) => c.frequency.value);
    // C_p = C_add / ((f1 / f2)^2 - 1), L_p = 1 / ((2 pi f1)^2 C_p) (added-capacitor method); R_p = 2 alpha L_p (series loop).
    const cp = ADDED / ((f1 / f2) ** 2 - 1);
    expect(r.C.value / cp - 1).toBeCloseTo(0, 12);
    expect(r.L.value / (1 / ((2 * Math.PI * f1) ** 2 * cp)) - 1).toBeCloseTo(0, 12);
    expect(r.R.value / (2 * r.captures[0].alpha.value * r.L.value) - 1).toBeCloseTo(0, 12);
  });

  it('their stated standard uncertainties match the spread of the errors over 60 seeds', () => {
    const z = { L: [] as number[], C: [] as number[], R: [] as number[] };
    for (let seed = 1; seed <= 60; seed++) {
      const r = extract(seed);
      z.L.push((r.L.value - L) / r.L.stderr!);
      z.C.push((r.C.value - C) / r.C.stderr!);
      z.R.push((r.R.value - R) / r.R.stderr!);
    }
    for (const errors of Object.values(z)) {
      const mean = errors.reduce((a, b) => a + b, 0) / errors.length;
      const spread = Math.sqrt(errors.reduce((a, b) => a + (b - mean) ** 2, 0) / (errors.length - 1));
      // 60 draws estimate a standard deviation to about 9 %: honest errors give a spread of 1 within 0.75 to 1.3.
      expect(Math.abs(mean)).toBeLessThan(0.4);
      expect(spread).toBeGreaterThan(0.75);
      expect(spread).toBeLessThan(1.3);
      expect(errors.filter((e) => Math.abs(e) <= 2).length).toBeGreaterThanOrEqual(54);
    }
  });

  it('a thinly sampled capture is warned of once, by its file name', () => {
    // Every 1.6 ns: the bare loop's 100 MHz ring has 6 samples per period, the loaded one's 65 MHz ring about 9.6.
    const outcome = measureParasiticsOutcome({
      captures: [
        { file: 'bare.csv', channel: capture(C, 11, 1.6e-9), addedC: 0 },
        { file: 'added.csv', channel: capture(C + ADDED, 12, 1.6e-9), addedC: ADDED },
      ],
      addedTolerance: 0,
    });
    const thin = outcome.result!.warnings.filter((w) => /samples/.test(w) && /period/.test(w));
    expect(thin).toHaveLength(2);
    expect(thin[0]).toMatch(/^bare\.csv: period holds only 6\.\d samples/);
    expect(thin[1]).toMatch(/^added\.csv: period holds only 9\.\d samples/);
  });
});
