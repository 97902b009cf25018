/**
 * Row structure of each supernode: its own columns, the rows below them that
 * A contributes, and the rows its children pass up (the structure of a column
 * of L is the union of its children's and A's, Liu 1990, SIAM J. Matrix Anal.
 * Appl. 11(1)). One marker array; each list is sorted once.
 */
import type { Graph } from "../graph/types.js";
import { childLists } from "./etree.js";
import type { SupernodalStructure } from "./types.js";

/**
 * Build the supernodal structure. `start`/`parent` describe supernodes in
 * postorder over the final numbering (`permutation`: new → old, `inverse`:
 * old → new); `rows` is the predicted row count of each supernode, used to
 * size the arrays before filling them.
 */
export function buildStructure(
  g: Graph, permutation: Int32Array, inverse: Int32Array,
  start: Int32Array, parent: Int32Array, rows: Int32Array,
): SupernodalStructure {
  const n = g.n, ns = parent.length, { offsets, neighbours } = g;
  const rowPtr = new Int32Array(ns + 1);
  for (let s = 0; s < ns; s++) rowPtr[s + 1] = rowPtr[s] + rows[s];
  const rowIdx = new Int32Array(rowPtr[ns]);
  const factorPtr = new Float64Array(ns + 1);
  const columnSupernode = new Int32Array(n);
  const mark = new Int32Array(n).fill(-1);
  const { childPtr, children } = childLists(parent); // postorder: every child precedes its parent
  for (let s = 0; s < ns; s++) {
    const f = start[s], l = start[s + 1] - 1, base = rowPtr[s];
    let q = base;
    for (let j = f; j <= l; j++) { columnSupernode[j] = s; mark[j] = s; rowIdx[q++] = j; }
    for (let j = f; j <= l; j++) {
      const v = permutation[j];
      for (let p = offsets[v]; p < offsets[v + 1]; p++) {
        const i = inverse[neighbours[p]];
        if (i > l && mark[i] !== s) { mark[i] = s; q = push(rowIdx, q, rowPtr[s + 1], i, s); }
      }
    }
    for (let k = childPtr[s]; k < childPtr[s + 1]; k++) {
      const c = children[k];
      for (let p = rowPtr[c] + (start[c + 1] - start[c]); p < rowPtr[c + 1]; p++) {
        const i = rowIdx[p];
        if (i > l && mark[i] !== s) { mark[i] = s; q = push(rowIdx, q, rowPtr[s + 1], i, s); }
      }
    }
    if (q !== rowPtr[s + 1]) throw new Error(`internal: supernode ${s} has ${q - base} rows, predicted ${rows[s]}`);
    sortTail(rowIdx, base + (l - f + 1), q, l, mark, s);
    factorPtr[s + 1] = factorPtr[s] + (q - base) * (l - f + 1);
  }
  return {
    n, supernodeCount: ns, superStart: start, superParent: parent, rowPtr, rowIdx, factorPtr, columnSupernode,
  };
}

/**
 * Sort the rows below the diagonal block. Often they arrive sorted (one
 * child, nothing new from A); when they span a narrow range, rescanning the
 * marker array over that range is linear; otherwise sort.
 */
function sortTail(rowIdx: Int32Array, from: number, to: number, l: number, mark: Int32Array, s: number): void {
  let sorted = true, max = l;
  for (let q = from; q < to; q++) {
    const i = rowIdx[q];
    if (i < max) sorted = false; else max = i;
  }
  if (sorted) return;
  if (max - l <= 8 * (to - from)) {
    let q = from;
    for (let i = l + 1; i <= max; i++) if (mark[i] === s) rowIdx[q++] = i;
  } else {
    rowIdx.subarray(from, to).sort();
  }
}

function push(rowIdx: Int32Array, q: number, end: number, i: number, s: number): number {
  if (q >= end) throw new Error(`internal: supernode ${s} has more rows than predicted`);
  rowIdx[q] = i;
  return q + 1;
}
