// An RC snubber starting point for a ringing loop, its dissipation, and the predicted damping with it.
import { quantity, type Quantity } from '../quantity';
import { cubicRoots, quadraticRoots, type Complex } from './cubicRoots';
import { CircuitInputError } from './errors';
import { loopStepResponse, SETTLING_BAND, type StepMetrics } from './loopStepResponse';

export interface SnubberLoop {
  /** Loop (parasitic) inductance L_p, H. */
  L: Quantity;
  /** Node (parasitic) capacitance C_p, F. */
  C: Quantity;
  /** Loop series resistance R_p, ohm. Default 0 (the snubber alone damps the loop). */
  R?: Quantity;
  /** sqrt(L_p / C_p) with its uncertainty when known (e.g. from extractParasitics); else computed. */
  characteristicImpedance?: Quantity;
}

export interface SnubberOptions {
  /** Snubber capacitance as a multiple of C_p. Default 4, the upper end of the usual 3 to 4. */
  capacitanceRatio?: number;
  /** Voltage the snubber capacitor swings each edge, V (with switchingFrequency: the power). */
  voltage?: number;
  /** Switching frequency, Hz. */
  switchingFrequency?: number;
}

/** A second-order description of a loop: the bare one, or the dominant poles of the snubbed one. */
export interface LoopDamping {
  alpha: number;
  omega0: number;
  /** Ring angular frequency, rad/s; null when the poles are real. */
  omegaD: number | null;
  zeta: number;
  Q: number;
}

export interface SnubberSuggestion {
  /** Snubber resistor: the loop's characteristic impedance sqrt(L_p / C_p). */
  R: Quantity;
  /** Snubber capacitor: capacitanceRatio x C_p. */
  C: Quantity;
  /** The usual range of the capacitor, 3 C_p to 4 C_p, F. */
  capacitanceRange: { min: number; max: number };
  /** Resistor dissipation per V^2 Hz (P = C V^2 f_sw), W / (V^2 Hz): numerically the snubber C. */
  powerPerVoltSquaredHertz: number;
  /** Dissipation at the given voltage and switching frequency, or null when they were not given. */
  powerAt: { voltage: number; frequency: number; power: number } | null;
  /** The loop without the snubber, with the node's response to a step of the source. */
  before: LoopDamping & { step: StepMetrics };
  /**
   * The loop with the snubber: the second-order description of its pair (see method), all three poles
   * in rad/s, and the step response of the whole third-order loop, which is what the node does.
   */
  predicted: LoopDamping & {
    method: string;
    poles: Complex[];
    otherPole: number;
    /** Whether the third pole decays at least DOMINANCE_RATIO times faster than the pair. */
    pairDominant: boolean;
    /** Overshoot a second-order loop with the pair's zeta would have (what zeta alone promises), a fraction. */
    pairOvershoot: number;
    step: StepMetrics;
    /**
     * How far the step metrics move when the loop's L_p, C_p and R_p move by their standard errors, the
     * snubber parts held: the sum of each one's effect, an upper bound whatever their correlation. Null
     * when a loop value has no standard error.
     */
    stepStderr: { overshoot: number; settlingTime: number | null } | null;
  };
  /** The settling band of the step metrics, a fraction of the step. */
  settlingBand: number;
  notes: string[];
}

/** Low end of the usual snubber capacitance range, times C_p (common practice, from memory). */
const RATIO_LOW = 3;
/** High end, and the default: the larger capacitor damps harder for more dissipation. */
const RATIO_HIGH = 4;
/**
 * A pole pair dominates when the other pole decays at least this many times faster (the usual rule of
 * thumb is 5 to 10, common practice, from memory); below it the step response is the third-order one.
 */
const DOMINANCE_RATIO = 5;

/**
 * R = sqrt(L_p / C_p), C = 4 C_p by default (3 to 4 C_p is the usual starting range, common practice,
 * from memory); P = C V^2 f_sw (derived: each charge and each discharge of C through R dissipates
 * C V^2 / 2). With the snubber (R_s + C_s across C_p, the loop L_p + R_p driven from a stiff source)
 * the characteristic polynomial is cubic; in the variable z = s sqrt(L_p C_p), with m = C_s / C_p,
 * r = R_s / Z0 and rho = R_p / Z0:
 *   r m z^3 + (1 + m + rho r m) z^2 + (rho (1 + m) + r m) z + 1 = 0.
 * Its complex (ringing) pair, or when all poles are real its two slowest (the dominant-pole
 * approximation), is reported as the new alpha, omega0; the remaining real pole is given beside it.
 * What the node does is the step response of the whole loop, v / V_step = (1 + r m z) / cubic
 * (derived, the same circuit laws), from which the overshoot and the settling time are taken: the
 * snubber's zero and a slow third pole can leave far more overshoot than the pair's zeta suggests.
 * R and C stay at the common-practice starting point rather than being chosen for an overshoot target:
 * less overshoot takes a larger C, and the dissipation grows with C, a trade the user weighs with the
 * real overshoot in hand (capacitanceRatio sets C).
 */
export function suggestSnubber(loop: SnubberLoop, options: SnubberOptions = {}): SnubberSuggestion {
  const ratio = options.capacitanceRatio ?? RATIO_HIGH;
  validate(loop, options, ratio);
  const Lp = loop.L.value;
  const Cp = loop.C.value;
  const Rp = loop.R?.value ?? 0;
  const z0 = Math.sqrt(Lp / Cp);
  const R = loop.characteristicImpedance ?? quantity(z0, impedanceStderr(loop.L, loop.C, z0), 'ohm');
  const C = quantity(ratio * Cp, loop.C.stderr === null ? null : ratio * loop.C.stderr, 'F');

  const omegaRef = 1 / Math.sqrt(Lp * Cp);
  const snubbed = snubbedLoop({ Lp, Cp, Rp, Rs: R.value, Cs: C.value });
  const poles = snubbed.poles;
  const { pair, other, method } = ringingPair(poles);
  const pairDamping = dampingFromPair(pair);
  const pairDecay = Math.max(...pair.map((p) => Math.abs(p.re)));
  const pairDominant = Math.abs(other) >= DOMINANCE_RATIO * pairDecay;
  const step = snubbed.step;
  const bareStep = inSeconds(loopStepResponse([1], quadraticRoots(Rp / z0, 1), 1).metrics, omegaRef);
  const pairOvershoot = secondOrderOvershoot(pairDamping.zeta);

  const bareAlpha = Rp / (2 * Lp);
  const notes = [
    'A starting point to verify on the bench: measure the ring again with the snubber fitted and adjust.',
    'Use a non-inductive resistor rated for the dissipation with margin, and a capacitor rated for the voltage and the ripple current.',
  ];
  if (loop.R === undefined) notes.push('No loop resistance was given: the loop is taken as lossless before the snubber.');
  if (!pairDominant) notes.push(notDominantNote(pair[0].im !== 0, other, pairDecay, step.overshoot, pairDamping.zeta, pairOvershoot));
  const powerAt =
    options.voltage !== undefined && options.switchingFrequency !== undefined
      ? { voltage: options.voltage, frequency: options.switchingFrequency, power: C.value * options.voltage ** 2 * options.switchingFrequency }
      : null;
  return {
    R,
    C,
    capacitanceRange: { min: RATIO_LOW * Cp, max: RATIO_HIGH * Cp },
    powerPerVoltSquaredHertz: C.value,
    powerAt,
    before: { ...dampingOf(bareAlpha, omegaRef), step: bareStep },
    predicted: { ...pairDamping, method, poles, otherPole: other, pairDominant, pairOvershoot, step, stepStderr: stepStderr(loop, R.value, C.value, step) },
    settlingBand: SETTLING_BAND,
    notes,
  };
}

interface LoopParts {
  Lp: number;
  Cp: number;
  Rp: number;
  Rs: number;
  Cs: number;
}

/** Poles (rad/s) and step metrics (s) of the snubbed loop, from the cubic in z = s sqrt(L_p C_p) (see suggestSnubber). */
function snubbedLoop({ Lp, Cp, Rp, Rs, Cs }: LoopParts): { poles: Complex[]; step: StepMetrics } {
  const z0 = Math.sqrt(Lp / Cp);
  const omegaRef = 1 / Math.sqrt(Lp * Cp);
  const m = Cs / Cp;
  const r = Rs / z0;
  const rho = Rp / z0;
  const zRoots = cubicRoots(r * m, 1 + m + rho * r * m, rho * (1 + m) + r * m, 1);
  return {
    poles: zRoots.map((p) => ({ re: p.re * omegaRef, im: p.im * omegaRef })),
    step: inSeconds(loopStepResponse([1, r * m], zRoots, r * m).metrics, omegaRef),
  };
}

/** Each loop value moved by its standard error both ways, the larger change kept, the changes summed (see stepStderr). */
function stepStderr(loop: SnubberLoop, Rs: number, Cs: number, step: StepMetrics): { overshoot: number; settlingTime: number | null } | null {
  const R = loop.R ?? { value: 0, stderr: 0 };
  if (loop.L.stderr === null || loop.C.stderr === null || R.stderr === null) return null;
  const base: LoopParts = { Lp: loop.L.value, Cp: loop.C.value, Rp: R.value, Rs, Cs };
  let overshoot = 0;
  let settling: number | null = 0;
  for (const [key, u] of [['Lp', loop.L.stderr], ['Cp', loop.C.stderr], ['Rp', R.stderr]] as const) {
    const moved = [-1, 1].map((sign) => snubbedLoop({ ...base, [key]: Math.max(0, base[key] + sign * u) }).step);
    overshoot += Math.max(...moved.map((m) => Math.abs(m.overshoot - step.overshoot)));
    settling =
      settling === null || step.settlingTime === null || moved.some((m) => m.settlingTime === null)
        ? null
        : settling + Math.max(...moved.map((m) => Math.abs(m.settlingTime! - step.settlingTime!)));
  }
  return { overshoot, settlingTime: settling };
}

/** The complex (ringing) pair, or the two slowest real poles; `other` is the remaining real pole, s^-1. */
function ringingPair(poles: Complex[]): { pair: [Complex, Complex]; other: number; method: string } {
  const complex = poles.filter((p) => p.im !== 0);
  if (complex.length === 2) {
    return {
      pair: [complex[0], complex[1]],
      other: poles.find((p) => p.im === 0)!.re,
      method: 'second-order approximation of the snubbed (third-order) loop: its ringing pole pair, exact roots of the cubic',
    };
  }
  const byDecay = [...poles].sort((a, b) => Math.abs(a.re) - Math.abs(b.re));
  return {
    pair: [byDecay[0], byDecay[1]],
    other: byDecay[2].re,
    method: 'dominant-pole approximation of the snubbed (third-order) loop: its two slowest real poles, exact roots of the cubic',
  };
}

/** Overshoot of a second-order step with this zeta: exp(-pi zeta / sqrt(1 - zeta^2)) below 1, else none (handbook relation). */
function secondOrderOvershoot(zeta: number): number {
  return zeta < 1 ? Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)) : 0;
}

function notDominantNote(ringing: boolean, other: number, pairDecay: number, overshoot: number, zeta: number, pairOvershoot: number): string {
  const ratio = Math.abs(other) / pairDecay;
  const pace = ratio < 1 ? 'more slowly than the pair' : `only ${ratio.toFixed(1)} times faster than the pair`;
  const percent = (x: number) => `${(x * 100).toFixed(1)} %`;
  return (
    `The ${ringing ? 'ringing' : 'slowest'} pole pair does not dominate the snubbed loop: its third pole decays ${pace}, and the node overshoots ${percent(overshoot)} ` +
    `where a second-order loop with zeta ${zeta.toPrecision(3)} would overshoot ${percent(pairOvershoot)}. Judge the snubber by the step response, not by zeta.`
  );
}

/** Step metrics computed in the scaled time omega_ref t, in seconds. */
function inSeconds(metrics: StepMetrics, omegaRef: number): StepMetrics {
  const seconds = (t: number | null) => (t === null ? null : t / omegaRef);
  return { overshoot: metrics.overshoot, peakTime: seconds(metrics.peakTime), settlingTime: seconds(metrics.settlingTime) };
}

function dampingFromPair([p1, p2]: [Complex, Complex]): LoopDamping {
  // (s - p1)(s - p2) = s^2 + 2 alpha s + omega0^2.
  const alpha = -(p1.re + p2.re) / 2;
  const omega0 = Math.sqrt(p1.re * p2.re - p1.im * p2.im);
  return dampingOf(alpha, omega0);
}

function dampingOf(alpha: number, omega0: number): LoopDamping {
  const q = omega0 * omega0 - alpha * alpha;
  return { alpha, omega0, omegaD: q > 0 ? Math.sqrt(q) : null, zeta: alpha / omega0, Q: omega0 / (2 * alpha) };
}

function impedanceStderr(L: Quantity, C: Quantity, z0: number): number | null {
  if (L.stderr === null || C.stderr === null) return null;
  return (z0 / 2) * Math.hypot(L.stderr / L.value, C.stderr / C.value);
}

function validate(loop: SnubberLoop, options: SnubberOptions, ratio: number): void {
  const positive = (field: string, v: number | undefined, unit: string) => {
    if (v !== undefined && !(Number.isFinite(v) && v > 0)) throw new CircuitInputError(field, `must be a positive finite value in ${unit}, got ${v}`);
  };
  positive('loop.L', loop.L?.value ?? NaN, 'H');
  positive('loop.C', loop.C?.value ?? NaN, 'F');
  if (loop.R !== undefined && !(Number.isFinite(loop.R.value) && loop.R.value >= 0)) {
    throw new CircuitInputError('loop.R', `must be a finite resistance >= 0 ohm, got ${loop.R.value}`);
  }
  positive('loop.characteristicImpedance', loop.characteristicImpedance?.value, 'ohm');
  positive('options.capacitanceRatio', ratio, 'multiples of C_p');
  positive('options.voltage', options.voltage, 'V');
  positive('options.switchingFrequency', options.switchingFrequency, 'Hz');
  if ((options.voltage === undefined) !== (options.switchingFrequency === undefined)) {
    throw new CircuitInputError(
      options.voltage === undefined ? 'options.voltage' : 'options.switchingFrequency',
      'the dissipation needs both the voltage and the switching frequency',
    );
  }
}
