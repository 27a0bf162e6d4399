// Cp and Cpk against a hand computation on a fixed set, and the cases where they are not defined.
// Formulas: NIST/SEMATECH e-Handbook of Statistical Methods, section 6.1.6 "What is Process Capability?":
// Cp = (USL - LSL) / (6 sigma), Cpk = min(USL - mu, mu - LSL) / (3 sigma), one-sided limits use the one side.
// sigma is estimated by the sample standard deviation s (n - 1 in the denominator).
import { describe, expect, it } from 'vitest';
import { CAPABILITY_RULE, processCapability, sampleStatistics } from '../../core/report/capability';
import { histogramOf, sturgesBins } from '../../core/report/histogram';

// Five resonance frequencies of a lot, in MHz (our own bench scenario).
const VALUES = [9.8, 10.1, 10.0, 9.9, 10.2];

// By hand: mean = 50.0 / 5 = 10.0; squared deviations 0.04 + 0.01 + 0 + 0.01 + 0.04 = 0.10;
// s^2 = 0.10 / (5 - 1) = 0.025, s = sqrt(0.025) = 0.1581139.
const HAND = { mean: 10.0, s: 0.15811388300841897 };

describe('sampleStatistics', () => {
  it('gives n, mean, the sample standard deviation (n - 1), min and max', () => {
    const stats = sampleStatistics(VALUES)!;
    expect(stats.n).toBe(5);
    expect(stats.mean).toBeCloseTo(HAND.mean, 12);
    expect(stats.sd).toBeCloseTo(HAND.s, 12);
    // The population deviation (n in the denominator) would be sqrt(0.02) = 0.1414: not what is used.
    expect(stats.sd).not.toBeCloseTo(Math.sqrt(0.02), 3);
    expect([stats.min, stats.max]).toEqual([9.8, 10.2]);
  });

  it('has no spread for one value and nothing for none', () => {
    expect(sampleStatistics([3])!.sd).toBeNull();
    expect(sampleStatistics([])).toBeNull();
  });
});

describe('processCapability (NIST/SEMATECH e-Handbook 6.1.6)', () => {
  const stats = sampleStatistics(VALUES)!;

  it('two-sided limits 9.5 to 10.6: Cp = 1.1 / (6 s) = 1.1595, Cpk = min(0.6, 0.5) / (3 s) = 1.0541', () => {
    const { cp, cpk } = processCapability(stats, { lower: 9.5, upper: 10.6 });
    expect(cp.value).toBeCloseTo(1.1 / (6 * HAND.s), 10);
    expect(cp.value).toBeCloseTo(1.159502, 6);
    expect(cpk.value).toBeCloseTo(0.5 / (3 * HAND.s), 10);
    expect(cpk.value).toBeCloseTo(1.054093, 6);
  });

  // The 95 % intervals, against scipy.stats (chi2.ppf, norm.ppf) on the same set: chi^2(0.025; 4) = 0.4844186,
  // chi^2(0.975; 4) = 11.143287, z(0.975) = 1.959964. Cp: exact for a normal process; Cpk: Bissell's approximation.
  it('gives Cp its chi-square interval, 1.1595 [0.40351, 1.93530], and Cpk Bissell\'s, 1.0541 [0.26739, 1.84080]', () => {
    const { cp, cpk } = processCapability(stats, { lower: 9.5, upper: 10.6 });
    if (cp.value === null || cpk.value === null) throw new Error('both indices are defined here');
    expect(cp.interval.lower).toBeCloseTo(0.4035077, 6);
    expect(cp.interval.upper).toBeCloseTo(1.9352991, 6);
    expect(cpk.interval.lower).toBeCloseTo(0.2673895, 6);
    expect(cpk.interval.upper).toBeCloseTo(1.8407956, 6);
  });

  // By hand: sqrt(1/45 + 1.05409^2/8) / sqrt(1/270 + 1.05409^2/58) = 0.401389 / 0.151196 = 2.6548.
  it('narrows the interval as the lot grows: 30 units pin Cpk 2.65 times closer than 5 (same mean and s)', () => {
    const width = (n: number) => {
      const { cpk } = processCapability({ n, mean: 10, sd: HAND.s, min: 9.8, max: 10.2 }, { lower: 9.5, upper: 10.6 });
      return cpk.value === null ? NaN : cpk.interval.upper - cpk.interval.lower;
    };
    expect(width(5) / width(30)).toBeCloseTo(2.6548, 3);
  });

  it('an upper limit only: Cpk from the upper side, (10.6 - 10.0) / (3 s) = 1.2649; Cp not defined', () => {
    const { cp, cpk } = processCapability(stats, { lower: null, upper: 10.6 });
    expect(cpk.value).toBeCloseTo(1.264911, 6);
    expect(cp).toEqual({ value: null, reason: 'one-sided limit' });
  });

  it('a lower limit only: (10.0 - 9.5) / (3 s) = 1.0541', () => {
    expect(processCapability(stats, { lower: 9.5, upper: null }).cpk.value).toBeCloseTo(1.054093, 6);
  });

  it('a mean outside the limits gives a negative Cpk', () => {
    expect(processCapability(stats, { lower: 10.3, upper: 11 }).cpk.value).toBeCloseTo((10.0 - 10.3) / (3 * HAND.s), 10);
  });

  it.each([
    { limits: null, reason: 'no limits' },
    { limits: { lower: null, upper: null }, reason: 'no limits' },
  ])('no limits: neither is defined, never 0 or NaN ($limits)', ({ limits, reason }) => {
    const { cp, cpk } = processCapability(stats, limits);
    expect(cp).toEqual({ value: null, reason });
    expect(cpk).toEqual({ value: null, reason });
  });

  it('one unit or no spread: not defined, with the reason', () => {
    expect(processCapability(sampleStatistics([10])!, { lower: 9, upper: 11 }).cpk.reason).toBe('one unit only');
    expect(processCapability(sampleStatistics([10, 10, 10])!, { lower: 9, upper: 11 }).cp.reason).toBe('no spread');
  });

  it('states the formulas, their source and the sigma estimate', () => {
    expect(CAPABILITY_RULE).toContain('NIST/SEMATECH e-Handbook of Statistical Methods, 6.1.6');
    expect(CAPABILITY_RULE).toContain('sample standard deviation (n - 1)');
    expect(CAPABILITY_RULE).toContain("Bissell's approximation");
  });
});

describe('histogramOf', () => {
  it('uses 1 + ceil(log2 n) equal bins over the values and counts every value once', () => {
    expect(sturgesBins(40)).toBe(7);
    const h = histogramOf(VALUES)!;
    expect(h.counts.length).toBe(sturgesBins(5));
    expect(h.counts.reduce((a, b) => a + b, 0)).toBe(5);
    expect(h.edges[0]).toBe(9.8);
    expect(h.edges[h.edges.length - 1]).toBe(10.2);
    // The largest value falls in the last bin, not beyond it.
    expect(h.counts[h.counts.length - 1]).toBeGreaterThan(0);
  });

  it('gives equal values one bin with some width, and nothing for no finite value', () => {
    const h = histogramOf([5, 5, 5])!;
    expect(h.counts).toEqual([3]);
    expect(h.edges[1]).toBeGreaterThan(h.edges[0]);
    expect(histogramOf([NaN])).toBeNull();
  });
});
