/**
 * Supernodes: fundamental supernodes (runs of columns j, j+1 with
 * parent(j) = j+1 and c_j = c_{j+1} + 1, whose structures nest exactly) and
 * relaxed amalgamation, which merges a child supernode into its parent when
 * the explicit zeros this adds stay within a bound, so the dense kernels get
 * larger blocks (Ashcraft & Grimes 1989, "The influence of relaxed supernode
 * partitions on the multifrontal method", ACM TOMS 15(4); Liu, Ng & Peyton
 * 1993, SIAM J. Matrix Anal. Appl. 14(1)).
 *
 * Input is an elimination tree already numbered in postorder. The result is
 * a new column order (still a topological order of the elimination tree, so
 * the fill is unchanged) in which every merged supernode is contiguous.
 */
import { InputError } from "../errors.js";
import { invertPermutation, postorder } from "./etree.js";

/** Bounds for relaxed amalgamation. */
export interface AmalgamationOptions {
  /** Merge freely while the merged supernode has at most this many columns and at most `smallZeroFraction` zeros. Default 16. */
  smallColumns?: number;
  /** Zero fraction allowed for small supernodes. Default 0.5. */
  smallZeroFraction?: number;
  /** Merge while the merged supernode has at most this many columns and at most `mediumZeroFraction` zeros. Default 64. */
  mediumColumns?: number;
  /** Zero fraction allowed for medium supernodes. Default 0.15. */
  mediumZeroFraction?: number;
  /** Zero fraction allowed for any larger merge. Default 0.04. */
  largeZeroFraction?: number;
}

const DEFAULTS: Required<AmalgamationOptions> = {
  smallColumns: 16,
  smallZeroFraction: 0.5,
  mediumColumns: 64,
  mediumZeroFraction: 0.15,
  largeZeroFraction: 0.04,
};

/** A supernode partition in a (possibly new) postorder. */
export interface Partition {
  /** order[k] = old (postordered) column placed at new position k. */
  readonly order: Int32Array;
  /** Supernode s owns new columns [start[s], start[s+1]). */
  readonly start: Int32Array;
  /** Parent supernode, -1 for roots. */
  readonly parent: Int32Array;
  /** Rows of each supernode (own columns + rows below), explicit zeros included. */
  readonly rows: Int32Array;
}

/** Fundamental supernodes of a postordered tree: start[] boundaries. */
export function fundamentalSupernodes(parent: Int32Array, counts: Int32Array): Int32Array {
  const n = parent.length;
  const starts = new Int32Array(n + 1);
  let ns = 0;
  for (let j = 0; j < n; j++) {
    if (j === 0 || parent[j - 1] !== j || counts[j - 1] !== counts[j] + 1) starts[ns++] = j;
  }
  starts[ns] = n;
  return starts.slice(0, ns + 1);
}

/**
 * Fundamental supernodes, then relaxed amalgamation (`options === false`
 * keeps the fundamental partition), then a postorder of the merged tree.
 */
export function supernodePartition(
  parent: Int32Array, counts: Int32Array, options: AmalgamationOptions | false = {},
): Partition {
  const n = parent.length;
  const fstart = fundamentalSupernodes(parent, counts);
  const ns = fstart.length - 1;
  const owner = new Int32Array(n);
  for (let s = 0; s < ns; s++) owner.fill(s, fstart[s], fstart[s + 1]);
  const sparent = new Int32Array(ns), ncols = new Int32Array(ns), nrows = new Int32Array(ns);
  const zeros = new Float64Array(ns);
  for (let s = 0; s < ns; s++) {
    const last = fstart[s + 1] - 1;
    sparent[s] = parent[last] === -1 ? -1 : owner[parent[last]];
    ncols[s] = fstart[s + 1] - fstart[s];
    nrows[s] = counts[fstart[s]];
  }
  const rep = new Int32Array(ns);
  for (let s = 0; s < ns; s++) rep[s] = s;
  if (options !== false) amalgamate(sparent, ncols, nrows, zeros, rep, amalgamationBounds(options));
  return mergedPostorder(n, fstart, sparent, nrows, rep);
}

/**
 * The caller's bounds over the defaults (a key left undefined keeps its
 * default); InputError naming a bound that is not a number >= 0, or a zero
 * fraction above 1.
 */
function amalgamationBounds(options: AmalgamationOptions): Required<AmalgamationOptions> {
  if (typeof options !== "object" || options === null) {
    throw new InputError(`amalgamation must be an object of bounds or false, got ${String(options)}`);
  }
  const o = { ...DEFAULTS };
  for (const key of Object.keys(DEFAULTS) as (keyof AmalgamationOptions)[]) {
    const v = options[key];
    if (v === undefined) continue;
    const limit = key.endsWith("Fraction") ? 1 : Infinity;
    if (typeof v !== "number" || !(v >= 0 && v <= limit)) {
      throw new InputError(`amalgamation.${key} must be a number in 0..${limit}, got ${String(v)}`);
    }
    o[key] = v;
  }
  return o;
}

/** Greedy merging of children into parents, children first (supernodes are in postorder). */
function amalgamate(
  sparent: Int32Array, ncols: Int32Array, nrows: Int32Array, zeros: Float64Array, rep: Int32Array,
  o: Required<AmalgamationOptions>,
): void {
  const ns = sparent.length;
  for (let c = 0; c < ns; c++) {
    const p = sparent[c];
    if (p === -1) continue;
    const cols = ncols[c] + ncols[p];
    const rows = ncols[c] + nrows[p];
    const added = ncols[c] * (ncols[c] + nrows[p] - nrows[c]);
    const z = zeros[c] + zeros[p] + added;
    const entries = cols * rows - (cols * (cols - 1)) / 2;
    const fraction = z / entries;
    const ok = added === 0
      || (cols <= o.smallColumns && fraction <= o.smallZeroFraction)
      || (cols <= o.mediumColumns && fraction <= o.mediumZeroFraction)
      || fraction <= o.largeZeroFraction;
    if (!ok) continue;
    ncols[p] = cols;
    nrows[p] = rows;
    zeros[p] = z;
    rep[c] = p; // resolved to the final representative below
  }
  // Parents have larger indices, so a backward sweep resolves chains.
  for (let s = ns - 1; s >= 0; s--) if (rep[s] !== s) rep[s] = rep[rep[s]];
}

/** Postorder the merged tree and lay each merged supernode's columns out contiguously. */
function mergedPostorder(n: number, fstart: Int32Array, sparent: Int32Array, nrows: Int32Array, rep: Int32Array): Partition {
  const ns = sparent.length;
  const groupIndex = new Int32Array(ns).fill(-1);
  let ng = 0;
  for (let s = 0; s < ns; s++) if (rep[s] === s) groupIndex[s] = ng++;
  const gparent = new Int32Array(ng), grows = new Int32Array(ng);
  for (let s = 0; s < ns; s++) {
    if (rep[s] !== s) continue;
    const g = groupIndex[s];
    gparent[g] = sparent[s] === -1 ? -1 : groupIndex[rep[sparent[s]]];
    grows[g] = nrows[s];
  }
  const gorder = postorder(gparent);
  const gpos = invertPermutation(gorder);
  // Count columns per group position, then place columns stably.
  const start = new Int32Array(ng + 1);
  for (let s = 0; s < ns; s++) start[gpos[groupIndex[rep[s]]] + 1] += fstart[s + 1] - fstart[s];
  for (let t = 0; t < ng; t++) start[t + 1] += start[t];
  const next = start.slice(0, ng), order = new Int32Array(n);
  for (let s = 0; s < ns; s++) {
    const t = gpos[groupIndex[rep[s]]];
    for (let j = fstart[s]; j < fstart[s + 1]; j++) order[next[t]++] = j;
  }
  const parent = new Int32Array(ng), rows = new Int32Array(ng);
  for (let g = 0; g < ng; g++) {
    parent[gpos[g]] = gparent[g] === -1 ? -1 : gpos[gparent[g]];
    rows[gpos[g]] = grows[g];
  }
  return { order, start, parent, rows };
}
