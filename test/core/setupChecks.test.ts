// Setup checks: each fires on a seeded capture made to trigger it, and every one stays silent on the sample captures.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import type { Channel } from '../../core/capture/types';
import { DEFAULT_GROUND_LEAD, DEFAULT_PROBE_CAPACITANCE, groundLeadResonance } from '../../core/circuit/setupProbe';
import { averagingAcquisition, statedBandwidth } from '../../core/circuit/setupPreamble';
import { frontEndBias, onePoleFilter, ringGain } from '../../core/circuit/setupFrontEnd';
import { fitResponse } from '../../core/fit/fitResponse';
import { createRandom } from '../../core/random';
import { measureCapture, type MeasureRequest } from '../../core/workflow/measure';
import { ringFrequencyAlong, setupRefused, type SetupCheck, type SetupOptions } from '../../core/workflow/setupChecks';
import { parseKnown, parseTopology } from '../../core/workflow/userValues';
import { readSampleManifest, SAMPLE_DIR } from '../../sample-captures/sampleManifest';

interface RingSpec {
  /** Ring frequency (damped), Hz. */
  frequency: number;
  /** Damping ratio; 0 for a tone that does not decay. */
  zeta: number;
  samplesPerPeriod: number;
  /** Periods recorded after the event. */
  periods: number;
  /** Noise rms relative to the 1 V step. */
  noise?: number;
  unit?: string;
  /** Ring frequency at the record's end over the start's: a linear chirp of the phase rate. */
  chirp?: number;
  seed?: number;
}

const PRE_PERIODS = 3;

/** A 1 V step that rings (invented data): a flat head, then 1 - e^(-alpha t) cos(omega_d t) sampled with seeded noise. */
function ringChannel(spec: RingSpec): Channel {
  const omegaD = 2 * Math.PI * spec.frequency;
  const alpha = (spec.zeta * omegaD) / Math.sqrt(1 - spec.zeta * spec.zeta);
  const dt = 1 / (spec.frequency * spec.samplesPerPeriod);
  const n = Math.round((spec.periods + PRE_PERIODS) * spec.samplesPerPeriod);
  const random = createRandom(spec.seed ?? 1);
  const time = new Float64Array(n);
  const values = new Float64Array(n);
  const span = spec.periods / spec.frequency;
  const chirp = spec.chirp ?? 1;
  for (let i = 0; i < n; i++) {
    const t = (i - PRE_PERIODS * spec.samplesPerPeriod) * dt + dt / 3;
    time[i] = t;
    // Phase of a frequency moving linearly from omegaD to chirp * omegaD over the span.
    const phase = omegaD * (t + ((chirp - 1) * t * t) / (2 * span));
    const y = t < 0 ? 0 : 1 - Math.exp(-alpha * t) * Math.cos(phase);
    values[i] = y + (spec.noise ?? 0.002) * random.normal();
  }
  return { name: 'CH1', unit: spec.unit ?? 'V', time, values, clipped: new Uint8Array(n), dropped: 0 };
}

function checksOf(channel: Channel, extra: Partial<MeasureRequest> = {}): SetupCheck[] {
  return measureCapture({ file: 'seeded.csv', channel, ...extra }).setupChecks;
}

const BASE: RingSpec = { frequency: 10e6, zeta: 0.03, samplesPerPeriod: 20, periods: 24 };

describe('setup checks on seeded captures (invented data)', () => {
  it('a clean, well sampled ring raises none', () => {
    expect(checksOf(ringChannel(BASE))).toEqual([]);
  });

  it("a noise-free ring whose frequency moves by 1e-7 (a simulator's own step error) raises no drift", () => {
    expect(checksOf(ringChannel({ ...BASE, chirp: 1 + 1e-7, noise: 0 }))).toEqual([]);
  });

  const cases: { name: string; spec: RingSpec; request?: Partial<MeasureRequest>; id: SetupCheck['id']; level: SetupCheck['level']; says: RegExp }[] = [
    { name: '6 samples per period warns', spec: { ...BASE, samplesPerPeriod: 6 }, id: 'samples-per-period', level: 'warning', says: /6\.0 samples per ring period/ },
    { name: '2.4 samples per period refuses the frequency', spec: { ...BASE, zeta: 0.01, samplesPerPeriod: 2.4, periods: 60 }, id: 'samples-per-period', level: 'refusal', says: /2\.4 samples per ring period .* alias/ },
    { name: 'a tone that does not decay is refused as sustained', spec: { ...BASE, zeta: 0 }, id: 'sustained-oscillation', level: 'refusal', says: /sustained oscillation/ },
    { name: 'a ring that grows is refused, said to grow', spec: { ...BASE, zeta: -0.01 }, id: 'sustained-oscillation', level: 'refusal', says: /ring grows \(×\d\.\d\d from the first to the last third\)/ },
    { name: 'a ring growing ninetyfold is refused too', spec: { ...BASE, zeta: -0.03, noise: 0.01 }, id: 'sustained-oscillation', level: 'refusal', says: /(grows|does not decay) .*cannot be given/ },
    { name: 'a high-resolution acquisition mode in the preamble warns', spec: BASE, request: { metadata: { 'Acquisition Mode': 'High Res' } }, id: 'acquisition-mode', level: 'warning', says: /'Acquisition Mode: High Res'/ },
    { name: 'averaging, any spelling, warns', spec: BASE, request: { metadata: { ACQ: 'AVERage (16)' } }, id: 'acquisition-mode', level: 'warning', says: /low-pass/ },
    {
      name: 'a ring at the default ground-lead resonance warns',
      spec: { ...BASE, frequency: groundLeadResonance(DEFAULT_GROUND_LEAD, DEFAULT_PROBE_CAPACITANCE) },
      id: 'ground-lead',
      level: 'warning',
      says: /ground-lead resonance .*common practice.*assumed/,
    },
    { name: 'a ring drifting by 3 % warns with early and late frequencies', spec: { ...BASE, chirp: 0.97, zeta: 0.01 }, id: 'frequency-drift', level: 'warning', says: /drifts from 9\.9\d+ MHz .* early to 9\.7\d+ MHz .* late/ },
    { name: 'a noise-free ring drifting by 3 % warns too', spec: { ...BASE, chirp: 0.97, zeta: 0.01, noise: 0 }, id: 'frequency-drift', level: 'warning', says: /drifts from 9\.9\d+ MHz .* early to 9\.7\d+ MHz .* late/ },
    { name: 'a record shorter than a time constant notes it', spec: { ...BASE, zeta: 0.002, periods: 40 }, id: 'record-length', level: 'note', says: /0\.\d\d of the slowest time constant/ },
    {
      name: "the probe's capacitance corrects C and f0 beside the measured ones",
      spec: BASE,
      request: { setup: { probeCapacitance: 10e-12 }, knownPart: { topology: 'series', known: { name: 'L', value: 1e-6 } } },
      id: 'probe-loading',
      level: 'note',
      says: /C = 243\.\d+ pF .*\(measured 253\.\d+ pF .*\), f0 = 10\.2\d+ MHz .*\(measured 10\.0\d+ MHz/,
    },
    {
      name: 'a probe capacitance above the measured C is refused',
      spec: BASE,
      request: { setup: { probeCapacitance: 1e-9 }, knownPart: { topology: 'series', known: { name: 'L', value: 1e-6 } } },
      id: 'probe-loading',
      level: 'refusal',
      says: /not below the 253\.\d+ pF/,
    },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const checks = checksOf(ringChannel(c.spec), c.request);
      const found = checks.find((check) => check.id === c.id);
      expect(found, JSON.stringify(checks)).toBeDefined();
      expect(found!.level).toBe(c.level);
      expect(found!.message).toMatch(c.says);
      expect(found!.message).not.toContain('\n');
      expect(setupRefused(checks)).toBe(checks.some((check) => check.level === 'refusal'));
    });
  }

  it('a growing sine no decaying response fits (status no-response) is refused as growing', () => {
    const time = Float64Array.from({ length: 2000 }, (_, i) => i * 1e-8);
    const random = createRandom(4);
    const values = time.map((t) => Math.exp(2e5 * t) * Math.sin(2 * Math.PI * 1e6 * t + 0.3) + 0.005 * random.normal());
    const measured = measureCapture({ file: 'growing.csv', channel: { name: 'CH1', unit: 'V', time, values, clipped: new Uint8Array(2000), dropped: 0 } });
    expect(measured.fit.status).not.toBe('converged');
    expect(measured.setupChecks.map((c) => [c.id, c.level])).toEqual([['sustained-oscillation', 'refusal']]);
    expect(measured.setupChecks[0].message).toMatch(/^a 1\.000 MHz ring grows|^a 999\.\d kHz ring grows/);
  });

  it('noise alone (no ring at all) raises none', () => {
    for (const seed of [1, 2, 3]) {
      const random = createRandom(seed);
      const time = Float64Array.from({ length: 2000 }, (_, i) => i * 1e-8);
      const values = time.map(() => random.normal());
      expect(checksOf({ name: 'CH1', unit: 'V', time, values, clipped: new Uint8Array(2000), dropped: 0 }), `seed ${seed}`).toEqual([]);
    }
  });

  it('a current channel at the ground-lead resonance is not flagged (no voltage probe lead)', () => {
    const spec = { ...BASE, frequency: groundLeadResonance(DEFAULT_GROUND_LEAD, DEFAULT_PROBE_CAPACITANCE), unit: 'A' };
    expect(checksOf(ringChannel(spec)).map((c) => c.id)).not.toContain('ground-lead');
  });

  it('a stated ground lead and probe capacitance move the resonance the check compares with', () => {
    const spec = { ...BASE, frequency: groundLeadResonance(0.05, 12e-12) };
    const setup: SetupOptions = { groundLead: 0.05, probeCapacitance: 12e-12 };
    expect(checksOf(ringChannel(spec)).map((c) => c.id)).not.toContain('ground-lead');
    expect(checksOf(ringChannel(spec), { setup }).find((c) => c.id === 'ground-lead')?.message).not.toContain('assumed');
  });

  it('a bandwidth far above the ring is silent about bias; one at 3x the ring warns of the bias on alpha', () => {
    // 1 THz passes rings above half the 200 MSa/s sample rate: only the alias warning (below) speaks.
    expect(checksOf(ringChannel(BASE), { setup: { scopeBandwidth: 1e12 } }).map((c) => c.id)).toEqual(['alias']);
    const near = checksOf(ringChannel(BASE), { setup: { scopeBandwidth: 30e6 } }).find((c) => c.id === 'bandwidth');
    expect(near?.level).toBe('warning');
    expect(near?.message).toMatch(/first-order front end at 30 MHz \(the stated bandwidth\) moves the fitted alpha by about .* its standard error/);
  });

  it('a bandwidth stated in the preamble is used when none is given; the option wins over it', () => {
    const metadata = { 'Bandwidth Limit': '30MHz' };
    expect(checksOf(ringChannel(BASE), { metadata }).find((c) => c.id === 'bandwidth')?.message).toContain("the preamble's 'Bandwidth Limit: 30MHz'");
    expect(checksOf(ringChannel(BASE), { metadata, setup: { scopeBandwidth: 1e12 } }).map((c) => c.id)).toEqual(['alias']);
  });
});

describe('a front end that passes rings above half the sample rate (sampling theorem): the ring may be an alias', () => {
  // BASE: a 10 MHz ring sampled at 200 MSa/s; a 190 MHz ring (200 - 10) would show as it.
  it('warns when the bandwidth reaches the slowest ring that would show as this one, naming it and the rate to sample at', () => {
    const check = checksOf(ringChannel(BASE), { setup: { scopeBandwidth: 250e6 } }).find((c) => c.id === 'alias');
    expect(check?.level).toBe('warning');
    expect(check?.message).toBe(
      'the ring may be an alias: 250 MHz (the stated bandwidth) passes rings above half the 200 MSa/s sample rate: one at 190 MHz would show as this ' +
        '10 MHz ring; if the circuit can ring that fast, capture again at 625 MSa/s or more (the sampling theorem; 2.5 times the bandwidth: common practice)',
    );
    expect(check?.values).toMatchObject({ bandwidth: 250e6, source: 'option' });
    expect((check?.values?.alias as number) / 190e6).toBeCloseTo(1, 4);
  });

  it('is silent when the bandwidth stops that ring, or with no bandwidth known', () => {
    // 150 MHz still moves alpha by more than its error (the bias check), but stops the 190 MHz ring.
    expect(checksOf(ringChannel(BASE), { setup: { scopeBandwidth: 150e6 } }).map((c) => c.id)).toEqual(['bandwidth']);
    expect(checksOf(ringChannel(BASE))).toEqual([]);
  });

  it("reads the preamble's bandwidth too", () => {
    const check = checksOf(ringChannel(BASE), { metadata: { Bandwidth: '2.0E+08' } }).find((c) => c.id === 'alias');
    expect(check?.message).toContain("200 MHz (the preamble's 'Bandwidth: 2.0E+08') passes rings above half the 200 MSa/s sample rate");
  });

  it('leaves a ring under 2.5 samples a period to the refusal that already names the alias', () => {
    const checks = checksOf(ringChannel({ ...BASE, zeta: 0.01, samplesPerPeriod: 2.4, periods: 60 }), { setup: { scopeBandwidth: 1e9 } });
    expect(checks.map((c) => c.id)).not.toContain('alias');
    expect(checks[0]).toMatchObject({ id: 'samples-per-period', level: 'refusal' });
  });
});

describe('preamble reading', () => {
  it('reads a stated bandwidth, and not a limit that is off or full', () => {
    expect(statedBandwidth({ 'BW Limit': '20 MHz' })?.hertz).toBe(20e6);
    expect(statedBandwidth({ Bandwidth: '2.0E+08' })?.hertz).toBe(2e8);
    expect(statedBandwidth({ 'Bandwidth Limit': 'OFF' })).toBeNull();
    expect(statedBandwidth({ 'CH1 Bandwidth': 'Full' })).toBeNull();
    expect(statedBandwidth({ Title: 'bw test 20M', Instrument: 'scope' })).toBeNull();
  });
  it('finds an averaging acquisition mode whatever its spelling, and no other mode', () => {
    for (const value of ['HiRes', 'HIRES', 'Hi-Res', 'ERES', 'Average', 'Averaging (16)', 'avg']) expect(averagingAcquisition({ 'Acq Mode': value }), value).not.toBeNull();
    for (const value of ['Sample', 'Normal', 'Peak Detect']) expect(averagingAcquisition({ 'Acquisition Mode': value }), value).toBeNull();
    expect(averagingAcquisition({ Title: 'high res board' })).toBeNull();
  });
});

describe('the fit and the setup checks say thin sampling once', () => {
  it('6 samples per period: the setup warning, and no fit warning repeating it', () => {
    const result = measureCapture({ file: 'seeded.csv', channel: ringChannel({ ...BASE, samplesPerPeriod: 6 }) });
    expect(result.setupChecks.map((c) => c.id)).toContain('samples-per-period');
    expect(result.summary.warnings.filter((w) => /samples per ring period/.test(w))).toEqual([]);
  });
});

describe('ringFrequencyAlong', () => {
  it('follows a chirped ring within its standard errors, and a steady one stays put', () => {
    const fit = (spec: RingSpec) => {
      const channel = ringChannel({ ...spec, noise: 0.001 });
      const span = spec.periods / spec.frequency;
      return ringFrequencyAlong(channel.time, channel.values, { start: 0, end: span, alpha: 0, omegaD: 2 * Math.PI * spec.frequency, windows: 4 });
    };
    const steady = fit({ ...BASE, zeta: 0 });
    expect(steady).toHaveLength(4);
    for (const w of steady) expect(Math.abs(w.frequency.value - BASE.frequency)).toBeLessThan(4 * w.frequency.stderr!);
    // The frequency at a window's middle, for the linear chirp of ringChannel: f (1 + (k - 1) t / span).
    const chirped = fit({ ...BASE, zeta: 0, chirp: 0.97 });
    const span = BASE.periods / BASE.frequency;
    for (const w of chirped) {
      const expected = BASE.frequency * (1 + ((0.97 - 1) * (w.start + w.end)) / 2 / span);
      expect(Math.abs(w.frequency.value - expected)).toBeLessThan(4 * w.frequency.stderr!);
    }
  });
  it('follows a ring sampled 1000 times a period on block means (the long-record path), within its standard errors', () => {
    const spec: RingSpec = { ...BASE, zeta: 0, samplesPerPeriod: 1000, periods: 100, noise: 0.01, chirp: 0.97 };
    const channel = ringChannel(spec);
    const span = spec.periods / spec.frequency;
    const windows = ringFrequencyAlong(channel.time, channel.values, { start: 0, end: span, alpha: 0, omegaD: 2 * Math.PI * spec.frequency, windows: 4 });
    expect(windows).toHaveLength(4);
    for (const w of windows) {
      const expected = spec.frequency * (1 + ((0.97 - 1) * (w.start + w.end)) / 2 / span);
      expect(Math.abs(w.frequency.value - expected)).toBeLessThan(4 * w.frequency.stderr!);
      // The ring's amplitude (1 V) survives the averaging over 1/16 period or less.
      expect(w.amplitude).toBeGreaterThan(0.99);
    }
  });
  it('gives no window shorter than three ring periods', () => {
    const channel = ringChannel(BASE);
    expect(ringFrequencyAlong(channel.time, channel.values, { start: 0, end: 5 / BASE.frequency, alpha: 0, omegaD: 2 * Math.PI * BASE.frequency })).toEqual([]);
  });
});

describe('setup checks on the sample captures', () => {
  for (const entry of readSampleManifest().captures) {
    it(`${entry.file}: every check stays silent`, () => {
      const capture = parseCapture(readFileSync(path.join(SAMPLE_DIR, entry.file), 'utf8'));
      const channel = selectChannel(capture, entry.channel);
      const knownPart = { topology: parseTopology(entry.topology), known: parseKnown(entry.known.option) };
      expect(measureCapture({ file: entry.file, channel, metadata: capture.metadata, knownPart }).setupChecks).toEqual([]);
    });
  }
});

describe('first-order front end (relation: H(s) = wb / (s + wb), the first-order low-pass transfer function)', () => {
  const alpha = 2e6;
  const omegaD = 2 * Math.PI * 10e6;
  const bandwidth = 100e6;

  it('answers c H(p) (e^(p t) - e^(-wb t)) to a ring c e^(p t) from rest, p = -alpha + j omega_d', () => {
    // x = Re{j e^(p t)} = -e^(-alpha t) sin(omega_d t): zero at t = 0, so the filter starts at rest.
    const h = 1e-10;
    const n = 4000;
    const x = Float64Array.from({ length: n }, (_, k) => -Math.exp(-alpha * k * h) * Math.sin(omegaD * k * h));
    const y = onePoleFilter(x, h, bandwidth);
    const wb = 2 * Math.PI * bandwidth;
    // H(p) = wb / (wb - alpha + j omega_d); j H(p) = wb (omega_d + j (wb - alpha)) / |wb - alpha + j omega_d|^2.
    const norm = (wb - alpha) ** 2 + omegaD ** 2;
    const [re, im] = [(wb * omegaD) / norm, (wb * (wb - alpha)) / norm];
    let worst = 0;
    for (let k = 0; k < n; k += 7) {
      const t = k * h;
      const ring = Math.exp(-alpha * t) * (re * Math.cos(omegaD * t) - im * Math.sin(omegaD * t));
      worst = Math.max(worst, Math.abs(y[k] - (ring - re * Math.exp(-wb * t))));
    }
    expect(worst).toBeLessThan(1e-4);
    expect(ringGain(alpha, omegaD, bandwidth)).toBeCloseTo(Math.hypot(re, im), 12);
  });

  it("keeps a ring's alpha through a one-pole IIR front end, and the predicted bias never understates the fits' error", () => {
    // A seeded 10 MHz ring through a plain one-pole IIR (y += k (x - y), k = 1 - e^(-wb h), on a grid 32 times finer
    // than the samples: another discretisation than onePoleFilter's), fitted; three seeds against the prediction.
    // The front end delays and rounds the start, which the fit takes as a later event with a jump (its initial value
    // fitted freely, t0 held between two samples): alpha then stays within 3 of its standard errors of the ring's.
    // (With the noise read 17 times too high from first differences, the search once stopped in a minimum of the
    // continuous start 4.6 standard errors off.) The prediction refits the fitted response through the front end with
    // t0 held in the same interval, which a second delay does not fit as well: it reads about 4 standard errors, more
    // than the fits' error (a warning on the safe side; known limit in the README).
    const slowFrontEnd = 50e6;
    const spec: RingSpec = { ...BASE, zeta: alpha / Math.hypot(alpha, omegaD), noise: 0.001, periods: 20 };
    const sub = 32;
    const direct: number[] = [];
    const predicted: number[] = [];
    const stderrs: number[] = [];
    for (const seed of [1, 2, 3]) {
      const clean = ringChannel({ ...spec, noise: 0 });
      const noisy = ringChannel({ ...spec, seed });
      const dt = clean.time[1] - clean.time[0];
      const k = 1 - Math.exp((-2 * Math.PI * slowFrontEnd * dt) / sub);
      const filtered = new Float64Array(clean.values.length);
      let state = 0;
      const wave = (t: number) => (t < 0 ? 0 : 1 - Math.exp(-alpha * t) * Math.cos(omegaD * t));
      for (let i = 0; i < clean.values.length; i++) {
        for (let j = sub - 1; j >= 0; j--) state += k * (wave(clean.time[i] - (j * dt) / sub) - state);
        filtered[i] = state + (noisy.values[i] - clean.values[i]);
      }
      const fit = fitResponse({ time: clean.time, values: filtered, clipped: clean.clipped, unit: 'V', name: 'CH1' });
      expect(fit.status).toBe('converged');
      expect(fit.jumpStart).toBe(true);
      expect(Math.abs(fit.alpha.value - alpha)).toBeLessThan(3 * fit.alpha.stderr!);
      const bias = frontEndBias(fit.params, { time: clean.time, unit: 'V' }, fit.window, fit.noiseRms, slowFrontEnd, fit.jumpStart ? 'free' : 'continuous');
      direct.push(fit.alpha.value - alpha);
      predicted.push(bias!.alphaBias);
      stderrs.push(fit.alpha.stderr!);
    }
    const mean = (v: number[]) => v.reduce((a, b) => a + b, 0) / v.length;
    // The prediction has the sign of the fits' error and is at least as large, within the mean's noise.
    expect(Math.sign(mean(predicted))).toBe(Math.sign(mean(direct)));
    expect(Math.abs(mean(predicted))).toBeGreaterThan(Math.abs(mean(direct)) - (3 * mean(stderrs)) / Math.sqrt(3));
  });
});
