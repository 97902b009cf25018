/**
 * A small deterministic pseudo-random generator (xorshift32, Marsaglia 2003,
 * "Xorshift RNGs", J. Stat. Software 8(14)) so that every ordering is
 * reproducible for a given seed.
 */
export class Rng {
  private state: number;
  constructor(seed: number) {
    this.state = (Math.imul((seed | 0) ^ 0x5bd1e995, 0x2545f491) | 0) || 0x1234567;
  }
  /** Next 32-bit unsigned value. */
  nextU32(): number {
    let x = this.state;
    x ^= x << 13;
    x ^= x >>> 17;
    x ^= x << 5;
    this.state = x;
    return x >>> 0;
  }
  /** Uniform integer in [0, bound). */
  below(bound: number): number {
    return Math.floor((this.nextU32() / 4294967296) * bound);
  }
  /** Fisher–Yates shuffle in place. */
  shuffle(a: Int32Array): void {
    for (let i = a.length - 1; i > 0; i--) {
      const j = this.below(i + 1);
      const t = a[i]; a[i] = a[j]; a[j] = t;
    }
  }
}
