/**
 * Symbolic analysis: from the graph of A and a fill-reducing ordering to the
 * supernodal structure of L. Elimination tree (Liu 1990), postorder, column
 * counts (Gilbert, Ng & Peyton 1994), fundamental supernodes with relaxed
 * amalgamation (Ashcraft & Grimes 1989), then the row structure of every
 * supernode. The final permutation is an equivalent reordering of the one
 * given (a topological order of the same elimination tree), so the fill is
 * exactly that of the ordering.
 */
import type { Graph } from "../graph/types.js";
import { eliminationTree, invertPermutation, postorder } from "./etree.js";
import { columnCounts } from "./column-counts.js";
import { supernodePartition, type AmalgamationOptions } from "./supernodes.js";
import { buildStructure } from "./structure.js";
import type { SupernodalStructure } from "./types.js";

export type { SupernodalStructure } from "./types.js";
export type { AmalgamationOptions } from "./supernodes.js";
export { eliminationTree, postorder } from "./etree.js";
export { columnCounts } from "./column-counts.js";

/** Everything the symbolic phase produces. */
export interface SymbolicResult {
  /** Final permutation, new → original. */
  readonly permutation: Int32Array;
  /** Its inverse, original → new. */
  readonly inverse: Int32Array;
  /** Elimination tree in the final numbering (-1 for roots). */
  readonly parent: Int32Array;
  /** Exact column counts of L in the final numbering (diagonal included). */
  readonly columnCounts: Int32Array;
  readonly structure: SupernodalStructure;
  /** Σ c_j: entries of L including the diagonal, without amalgamation zeros. */
  readonly nnzL: number;
  /** Σ c_j²: the leading term of Cholesky's flop count (AnalysisStats.flops). */
  readonly flops: number;
}

export { invertPermutation } from "./etree.js";

/** Elimination tree, a postorder of it and the column counts, for a valid permutation. */
function treeAndCounts(g: Graph, permutation: Int32Array) {
  const inverse = invertPermutation(permutation);
  const parent = eliminationTree(g, permutation, inverse);
  const order = postorder(parent);
  const counts = columnCounts(g, permutation, inverse, parent, order);
  return { parent, order, counts };
}

/** Σ c_j and Σ c_j² of column counts. */
function fillTotals(counts: Int32Array): { nnzL: number; flops: number } {
  let nnzL = 0, flops = 0;
  for (let j = 0; j < counts.length; j++) { nnzL += counts[j]; flops += counts[j] * counts[j]; }
  return { nnzL, flops };
}

/** Column counts of L for the given ordering, without building supernodes. */
export function countFill(g: Graph, permutation: Int32Array): { nnzL: number; flops: number; columnCounts: Int32Array } {
  const { counts } = treeAndCounts(g, permutation);
  return { ...fillTotals(counts), columnCounts: counts };
}

/** Run the whole symbolic phase for a valid permutation (new → original). */
export function symbolicFactorization(
  g: Graph, permutation: Int32Array, amalgamation: AmalgamationOptions | false = {},
): SymbolicResult {
  const n = g.n;
  const { parent: parent0, order, counts: counts0 } = treeAndCounts(g, permutation);
  // Relabel into postorder.
  const pos = invertPermutation(order);
  const parent1 = new Int32Array(n), counts1 = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const j = order[k];
    parent1[k] = parent0[j] === -1 ? -1 : pos[parent0[j]];
    counts1[k] = counts0[j];
  }
  const part = supernodePartition(parent1, counts1, amalgamation);
  // Compose: final position k holds postordered column part.order[k].
  const perm = new Int32Array(n), counts = new Int32Array(n);
  const pos2 = invertPermutation(part.order);
  const parent = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const j1 = part.order[k];
    perm[k] = permutation[order[j1]];
    counts[k] = counts1[j1];
    parent[k] = parent1[j1] === -1 ? -1 : pos2[parent1[j1]];
  }
  const inverse = invertPermutation(perm);
  const structure = buildStructure(g, perm, inverse, part.start, part.parent, part.rows);
  return { permutation: perm, inverse, parent, columnCounts: counts, structure, ...fillTotals(counts) };
}
