/**
 * A small seeded pseudo-random generator for simulation and tests: xoshiro128** (Blackman & Vigna,
 * "Scrambled linear pseudorandom number generators", 2018), seeded through splitmix32, with standard
 * normal draws by the Marsaglia polar method (Marsaglia & Bray 1964). Same seed, same stream, on
 * every platform.
 */
export interface Rng {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Standard normal. */
  normal(): number;
}

export function createRng(seed: number): Rng {
  let s = seed >>> 0;
  const splitmix = (): number => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
  let a = splitmix();
  let b = splitmix();
  let c = splitmix();
  let d = splitmix();
  if ((a | b | c | d) === 0) a = 1;
  const next32 = (): number => {
    const result = Math.imul(rotl(Math.imul(b, 5) >>> 0, 7), 9) >>> 0;
    const t = (b << 9) >>> 0;
    c ^= a;
    d ^= b;
    b ^= c;
    a ^= d;
    c ^= t;
    d = rotl(d, 11);
    return result;
  };
  let spare = Number.NaN;
  const uniform = (): number => (next32() * 2 ** 21 + (next32() >>> 11)) / 2 ** 53;
  return {
    uniform,
    normal(): number {
      if (!Number.isNaN(spare)) {
        const v = spare;
        spare = Number.NaN;
        return v;
      }
      let u: number;
      let v: number;
      let r2: number;
      do {
        u = 2 * uniform() - 1;
        v = 2 * uniform() - 1;
        r2 = u * u + v * v;
      } while (r2 >= 1 || r2 === 0);
      const f = Math.sqrt((-2 * Math.log(r2)) / r2);
      spare = v * f;
      return u * f;
    },
  };
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}
