/**
 * Seeded pseudo-random numbers: every stochastic computation in Multiplet takes a `Random` made from a seed, so a
 * notebook rerun gives identical results. Generator: xoshiro128** (Blackman & Vigna 2018), seeded through
 * splitmix32 so that nearby seeds give unrelated streams. 32-bit integer arithmetic only: identical on every JS engine.
 */
export interface Random {
  /** Uniform on [0, 1), 32 bits of resolution. */
  next(): number;
  /** Uniform on [0, 1) with 53 bits of resolution. */
  nextDouble(): number;
  /** Uniform integer in [0, n). */
  nextInt(n: number): number;
  /** Standard normal deviate (Marsaglia polar method). */
  normal(): number;
  /** A new independent generator derived from this one (for workers, chains, replicas). */
  fork(): Random;
  /** The generator state, to save and restore a stream exactly. */
  state(): [number, number, number, number];
}

function splitmix32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x9e3779b9) >>> 0;
    let z = a;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
}

/**
 * Make a seeded generator.
 * @example const rng = createRandom(42); rng.normal();
 */
export function createRandom(seed: number | [number, number, number, number]): Random {
  let s0: number, s1: number, s2: number, s3: number;
  if (Array.isArray(seed)) {
    [s0, s1, s2, s3] = seed.map((x) => x >>> 0) as [number, number, number, number];
  } else {
    const sm = splitmix32(Math.floor(seed) ^ Math.floor(seed / 4294967296));
    s0 = sm(); s1 = sm(); s2 = sm(); s3 = sm();
  }
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1;
  let spare: number | undefined;

  const nextU32 = (): number => {
    const result = Math.imul(rotl(Math.imul(s1, 5) >>> 0, 7), 9) >>> 0;
    const t = (s1 << 9) >>> 0;
    s2 = (s2 ^ s0) >>> 0;
    s3 = (s3 ^ s1) >>> 0;
    s1 = (s1 ^ s2) >>> 0;
    s0 = (s0 ^ s3) >>> 0;
    s2 = (s2 ^ t) >>> 0;
    s3 = rotl(s3, 11);
    return result;
  };

  const rng: Random = {
    next: () => nextU32() / 4294967296,
    nextDouble: () => ((nextU32() >>> 5) * 67108864 + (nextU32() >>> 6)) / 9007199254740992,
    nextInt: (n: number) => Math.floor((nextU32() / 4294967296) * n),
    normal: () => {
      if (spare !== undefined) {
        const v = spare;
        spare = undefined;
        return v;
      }
      let u: number, v: number, s: number;
      do {
        u = rng.nextDouble() * 2 - 1;
        v = rng.nextDouble() * 2 - 1;
        s = u * u + v * v;
      } while (s >= 1 || s === 0);
      const m = Math.sqrt((-2 * Math.log(s)) / s);
      spare = v * m;
      return u * m;
    },
    fork: () => createRandom([nextU32(), nextU32(), nextU32(), nextU32()]),
    state: () => [s0, s1, s2, s3],
  };
  return rng;
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}
