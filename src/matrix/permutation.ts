/**
 * Permutation check shared by the stages that take one from the caller (an
 * ordering, an inverse ordering): each entry in 0..n−1 and none repeated,
 * found in one pass with a first-seen array.
 */
import { InputError } from "../errors.js";

/** InputError naming the first entry of `p` (called `name` in the message) that makes it no permutation of 0..n−1. */
export function checkPermutation(p: Int32Array, n: number, name: string): void {
  if (!(p instanceof Int32Array)) throw new InputError(`${name} must be an Int32Array`);
  if (p.length !== n) throw new InputError(`${name} has length ${p.length}, expected n = ${n}`);
  const seen = new Int32Array(n).fill(-1);
  for (let k = 0; k < n; k++) {
    const v = p[k];
    if (v < 0 || v >= n) throw new InputError(`${name}[${k}] = ${v} is out of range 0..${n - 1}`);
    if (seen[v] !== -1) throw new InputError(`${name}[${k}] = ${v} repeats ${name}[${seen[v]}]; not a permutation`);
    seen[v] = k;
  }
}
