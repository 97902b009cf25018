/** Deterministic random numbers shared by the kernel tests. */

/** Deterministic pseudo-random doubles in [-1, 1) (xorshift32). */
export function randoms(len: number, seed: number): Float64Array {
  const out = new Float64Array(len);
  let s = seed | 0 || 1;
  for (let i = 0; i < len; i++) {
    s ^= s << 13; s ^= s >>> 17; s ^= s << 5;
    out[i] = ((s >>> 0) / 2 ** 32) * 2 - 1;
  }
  return out;
}
