// An independent check of the snubbed loop's step response: the circuit's state equations integrated by fixed-step RK4.

export interface SnubbedLoopParts {
  Lp: number;
  Cp: number;
  Rp: number;
  Rs: number;
  Cs: number;
}

/** Steps per 1 / omega_ref: RK4's error (fourth order) sits far below the 1e-4 the checks allow. */
const STEPS_PER_TIME_UNIT = 400;

/**
 * The node voltage after a 1 V step of a stiff source feeding L_p + R_p into C_p || (R_s + C_s),
 * everything at rest before (circuit laws: L di/dt = 1 - R_p i - v, C_p dv/dt = i - (v - v_s) / R_s,
 * C_s dv_s/dt = (v - v_s) / R_s), sampled every `interval` seconds up to `span`.
 */
export function integrateSnubbedStep(parts: SnubbedLoopParts, span: number, interval: number): { time: number[]; node: number[] } {
  const { Lp, Cp, Rp, Rs, Cs } = parts;
  const derivative = ([i, v, vs]: number[]) => [(1 - Rp * i - v) / Lp, (i - (v - vs) / Rs) / Cp, (v - vs) / Rs / Cs];
  const h = Math.sqrt(Lp * Cp) / STEPS_PER_TIME_UNIT;
  const perSample = Math.max(1, Math.round(interval / h));
  const dt = interval / perSample;
  let state = [0, 0, 0];
  const time = [0];
  const node = [0];
  const along = (x: number[], k: number[], f: number) => x.map((xi, j) => xi + f * k[j]);
  for (let n = 1; n * interval <= span; n++) {
    for (let s = 0; s < perSample; s++) {
      const k1 = derivative(state);
      const k2 = derivative(along(state, k1, dt / 2));
      const k3 = derivative(along(state, k2, dt / 2));
      const k4 = derivative(along(state, k3, dt));
      state = state.map((x, j) => x + (dt / 6) * (k1[j] + 2 * k2[j] + 2 * k3[j] + k4[j]));
    }
    time.push(n * interval);
    node.push(state[1]);
  }
  return { time, node };
}

/** Overshoot (fraction of the 1 V step) and the last time |v - 1| exceeds `band`, from samples. */
export function sampledStepMetrics(samples: { time: number[]; node: number[] }, band: number): { overshoot: number; settlingTime: number } {
  const overshoot = Math.max(0, Math.max(...samples.node) - 1);
  let last = 0;
  samples.node.forEach((v, k) => {
    if (Math.abs(v - 1) > band) last = k;
  });
  return { overshoot, settlingTime: samples.time[last] };
}
