// A small seeded random source (xoshiro128** with Box-Muller normals) for generators, tests and benchmarks.

export interface Random {
  /** Uniform on [0, 1), 2^-32 resolution. */
  uniform(): number;
  /** Standard normal (mean 0, standard deviation 1). */
  normal(): number;
}

/** splitmix32 step: spreads one 32-bit seed over the four state words. */
function splitMix(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
}

function rotateLeft(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}

/** A deterministic stream for an integer seed; the same seed always gives the same numbers. */
export function createRandom(seed: number): Random {
  if (!Number.isInteger(seed)) throw new RangeError(`createRandom: seed must be an integer, got ${seed}`);
  const next32 = splitMix(seed);
  let s0 = next32();
  let s1 = next32();
  let s2 = next32();
  let s3 = next32();

  const nextWord = (): number => {
    const result = Math.imul(rotateLeft(Math.imul(s1, 5) >>> 0, 7), 9) >>> 0;
    const t = (s1 << 9) >>> 0;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = rotateLeft(s3, 11);
    s0 >>>= 0;
    s1 >>>= 0;
    s2 >>>= 0;
    return result;
  };

  const uniform = (): number => nextWord() / 4294967296;

  let spare: number | null = null;
  const normal = (): number => {
    if (spare !== null) {
      const value = spare;
      spare = null;
      return value;
    }
    // 1 - u keeps the logarithm's argument in (0, 1].
    const radius = Math.sqrt(-2 * Math.log(1 - uniform()));
    const angle = 2 * Math.PI * uniform();
    spare = radius * Math.sin(angle);
    return radius * Math.cos(angle);
  };

  return { uniform, normal };
}
