/**
 * Binned density images of sparsity patterns: an n×n pattern is reduced to a
 * size×size grid of cells (size ≤ n), each cell counting its nonzeros, then
 * mapped to palette indices on a log scale of the filled fraction. The cost
 * is one pass over the entries; the image never grows with n.
 */
import type { SupernodalStructure } from "../symbolic/types.js";

/** Cell counts of a size×size binning (row-major, row = matrix row). */
export interface Binning {
  readonly n: number;
  readonly size: number;
  readonly counts: Float64Array;
}

/**
 * The number of cells per side for an n×n matrix: n itself up to `max`,
 * beyond that ceil(n / b) for the smallest whole block size b that fits, so
 * every cell but the last covers exactly b×b entries (no aliasing stripes).
 */
export function binCount(n: number, max = 400): number {
  return Math.max(1, Math.ceil(n / blockSize(n, Math.max(1, Math.min(n, max)))));
}

/** Entries per cell side when an n×n matrix is drawn with at most `size` cells per side. */
function blockSize(n: number, size: number): number {
  return Math.max(1, Math.ceil(n / size));
}

/**
 * Bin a symmetric pattern given by its lower triangle (CSC), optionally
 * renumbered by `inverse` (old → new), drawing both triangles.
 */
export function binSymmetric(n: number, colPtr: Int32Array, rowIdx: Int32Array, inverse: Int32Array | null, size: number): Binning {
  const counts = new Float64Array(size * size);
  const b = blockSize(n, size);
  for (let j = 0; j < n; j++) {
    const cj = Math.floor((inverse ? inverse[j] : j) / b);
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      const ci = Math.floor((inverse ? inverse[i] : i) / b);
      counts[ci * size + cj]++;
      if (i !== j) counts[cj * size + ci]++;
    }
  }
  return { n, size, counts };
}

/**
 * Bin the pattern of L from its supernodal structure, drawn in the lower
 * triangle. With `relabel` (structure position → drawn position) L is shown
 * in another numbering, e.g. that of an ordering whose equivalent reordering
 * the structure uses (the filled graph is the same, so L relabelled is the
 * factor in that numbering).
 */
export function binFactor(s: SupernodalStructure, size: number, relabel: Int32Array | null = null): Binning {
  const counts = new Float64Array(size * size);
  const b = blockSize(s.n, size);
  for (let k = 0; k < s.supernodeCount; k++) {
    const c0 = s.superStart[k], c1 = s.superStart[k + 1], r0 = s.rowPtr[k], r1 = s.rowPtr[k + 1];
    for (let j = c0; j < c1; j++) {
      const jj = relabel ? relabel[j] : j;
      for (let p = r0 + (j - c0); p < r1; p++) {
        const ii = relabel ? relabel[s.rowIdx[p]] : s.rowIdx[p];
        const hi = ii > jj ? ii : jj, lo = ii > jj ? jj : ii;
        counts[Math.floor(hi / b) * size + Math.floor(lo / b)]++;
      }
    }
  }
  return { n: s.n, size, counts };
}

/**
 * Palette indices: 0 for an empty cell, 1..255 along log(1 + 999 f) / log 1000
 * of the filled fraction f of a binned cell; a one-entry cell gets 0.7 of the ramp.
 */
export function densityPixels(b: Binning): Uint8Array {
  const { n, size, counts } = b;
  const pixels = new Uint8Array(size * size);
  const span = new Float64Array(size);
  const block = blockSize(n, size);
  for (let c = 0; c < size; c++) span[c] = Math.max(0, Math.min(block, n - c * block));
  const norm = 1 / Math.log(1000);
  for (let r = 0; r < size; r++) {
    for (let c = 0; c < size; c++) {
      const k = counts[r * size + c];
      if (k === 0) continue;
      const area = span[r] * span[c];
      // an unbinned entry gets a mid-dark tone; binned cells run along the log ramp
      const t = area === 1 ? 0.7 : Math.log1p(999 * Math.min(1, k / area)) * norm;
      pixels[r * size + c] = 1 + Math.round(254 * t);
    }
  }
  return pixels;
}
