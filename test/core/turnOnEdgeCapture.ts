// Seeded turn-on edges for the L_p cross-check tests: a current ramp through a loop of known L and the switch
// voltage, which drops by L di/dt while the current rises (v = L di/dt) and then falls to zero. Invented values.
import { createRandom } from '../../core/random';

export interface TurnOnEdge {
  time: Float64Array;
  current: Float64Array;
  voltage: Float64Array;
  /** The drop while a ramp rises, V: L x step / rise time (the mean drop of a raised-cosine rise differs). */
  drop: number;
}

export interface TurnOnEdgeSpec {
  L: number;
  seed: number;
  /** Bus voltage, V; load current step, A; current rise time (0-100 %), s. */
  bus?: number;
  step?: number;
  rise?: number;
  /** Sample interval, s; samples; rms noise of the current (A) and voltage (V). */
  dt?: number;
  samples?: number;
  currentNoise?: number;
  voltageNoise?: number;
  /** 'ramp': a straight rise, the drop flat; 'raised-cosine': an S-shaped rise, the drop L di/dt a half sine. Default 'ramp'. */
  shape?: 'ramp' | 'raised-cosine';
}

export function turnOnEdge(spec: TurnOnEdgeSpec): TurnOnEdge {
  const { L, seed, bus = 48, step = 20, rise = 30e-9, dt = 0.5e-9, samples = 800, currentNoise = 0.05, voltageNoise = 0.2, shape = 'ramp' } = spec;
  const random = createRandom(seed);
  const start = 0.375 * samples * dt;
  const fall = 10e-9;
  const drop = (L * step) / rise;
  const time = new Float64Array(samples);
  const current = new Float64Array(samples);
  const voltage = new Float64Array(samples);
  for (let i = 0; i < samples; i++) {
    const t = i * dt;
    time[i] = t;
    const into = t - start;
    const phase = Math.min(1, Math.max(0, into / rise));
    const smooth = shape === 'raised-cosine';
    current[i] = step * (smooth ? (1 - Math.cos(Math.PI * phase)) / 2 : phase) + currentNoise * random.normal();
    // v = L di/dt below the bus while the current rises.
    const rising = smooth ? bus - L * step * (Math.PI / (2 * rise)) * Math.sin(Math.PI * phase) : bus - drop;
    const atEnd = smooth ? bus : bus - drop;
    const v = into < 0 ? bus : into < rise ? rising : Math.max(0, atEnd * (1 - (into - rise) / fall));
    voltage[i] = v + voltageNoise * random.normal();
  }
  return { time, current, voltage, drop };
}

/** The edge as a capture file: time, switch voltage and current columns. */
export function turnOnEdgeCsv(edge: TurnOnEdge): string {
  const rows = ['Time (s),V_SW (V),I_D (A)'];
  for (let i = 0; i < edge.time.length; i++) rows.push(`${edge.time[i].toExponential(6)},${edge.voltage[i].toFixed(4)},${edge.current[i].toFixed(5)}`);
  return `${rows.join('\n')}\n`;
}
