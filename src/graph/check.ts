/**
 * Structural check of a Graph before an ordering works on it: offsets that
 * start at 0 and never decrease, neighbours in range, each list strictly
 * ascending without self loops, and every edge stored in both directions.
 * O(n + nnz), one Int32Array of length n.
 *
 * The symmetry test uses the ascending order: processing vertices v in
 * increasing order, the entries above u in u's list must appear exactly as the
 * vertices v > u that list u, in the same order, so a cursor per vertex suffices.
 * A well-formed graph passes in one sweep that tests everything at once; only
 * when that sweep fails does a second, check-by-check scan find the first
 * offending entry for the error message.
 */
import { InputError } from "../errors.js";
import type { Graph } from "./types.js";

/** Throws InputError naming the first offending vertex/entry (original numbering). */
export function checkGraph(graph: Graph, who: string): void {
  checkGraphShape(graph, who);
  const { n, offsets } = graph;
  if (offsets.length !== n + 1) {
    throw new InputError(`${who}: graph.offsets has length ${offsets.length}, expected n + 1 = ${n + 1}`);
  }
  if (passesAll(graph)) return;
  reportFirstError(graph, who);
}

/**
 * The fields a Graph must have, with their types; a matrix handed in where a
 * graph belongs is named as such (its adjacency graph comes from adjacencyGraph).
 */
export function checkGraphShape(graph: Graph, who: string): void {
  const g = graph as unknown as Record<string, unknown> | null;
  if (typeof g !== "object" || g === null) throw new InputError(`${who}: expected a Graph, got ${String(g)}`);
  if ("colPtr" in g && "rowIdx" in g) {
    throw new InputError(`${who}: expected a Graph, got a sparse matrix; pass adjacencyGraph(A)`);
  }
  const n = g.n;
  if (typeof n !== "number" || !Number.isInteger(n) || n < 0) {
    throw new InputError(`${who}: graph.n must be a non-negative integer, got ${String(n)}`);
  }
  if (!(g.offsets instanceof Int32Array) || !(g.neighbours instanceof Int32Array)) {
    throw new InputError(`${who}: graph.offsets and graph.neighbours must be Int32Arrays`);
  }
}

/**
 * Every check below in one sweep over the vertices: entries under v are matched
 * against their owners' cursors as they are met, entries above v only need to ascend.
 */
function passesAll(graph: Graph): boolean {
  const { n, offsets, neighbours } = graph;
  if (offsets[0] !== 0 || !(offsets[n] <= neighbours.length)) return false;
  const cursor = new Int32Array(n);
  for (let v = 0; v < n; v++) {
    const end = offsets[v + 1];
    let p = offsets[v];
    if (!(end >= p)) return false;
    let previous = -1;
    for (; p < end; p++) {
      const u = neighbours[p];
      if (!(u < v)) break;
      if (!(u > previous)) return false;
      previous = u;
      const c = cursor[u];
      if (c >= offsets[u + 1] || neighbours[c] !== v) return false;
      cursor[u] = c + 1;
    }
    if (p < end && neighbours[p] === v) return false;
    cursor[v] = p;
    for (; p < end; p++) {
      const u = neighbours[p];
      if (!(u > previous)) return false;
      previous = u;
    }
    if (previous >= n) return false;
  }
  for (let u = 0; u < n; u++) if (cursor[u] !== offsets[u + 1]) return false;
  return true;
}

/** The checks one by one, throwing InputError at the first failure. */
function reportFirstError(graph: Graph, who: string): void {
  const { n, offsets, neighbours } = graph;
  if (offsets[0] !== 0) throw new InputError(`${who}: graph.offsets[0] must be 0, got ${offsets[0]}`);
  for (let v = 0; v < n; v++) {
    if (offsets[v + 1] < offsets[v]) throw new InputError(`${who}: graph.offsets decreases at vertex ${v}`);
  }
  if (offsets[n] > neighbours.length) {
    throw new InputError(`${who}: graph.offsets[n] = ${offsets[n]} exceeds neighbours.length = ${neighbours.length}`);
  }
  const cursor = new Int32Array(n);
  for (let v = 0; v < n; v++) {
    const end = offsets[v + 1];
    let previous = -1;
    let firstAbove = end;
    for (let p = offsets[v]; p < end; p++) {
      const u = neighbours[p];
      if (!(u >= 0 && u < n)) throw new InputError(`${who}: vertex ${v} lists neighbour ${u}, outside 0..${n - 1}`);
      if (u <= previous) throw new InputError(`${who}: neighbours of vertex ${v} are not strictly ascending at ${u}`);
      if (u === v) throw new InputError(`${who}: vertex ${v} lists itself (self loop)`);
      if (u > v && firstAbove === end) firstAbove = p;
      previous = u;
    }
    cursor[v] = firstAbove;
  }
  for (let v = 0; v < n; v++) {
    const end = offsets[v + 1];
    for (let p = offsets[v]; p < end; p++) {
      const u = neighbours[p];
      if (u > v) break;
      if (cursor[u] >= offsets[u + 1] || neighbours[cursor[u]] !== v) {
        throw new InputError(`${who}: graph is not symmetric: vertex ${v} lists ${u} but ${u} does not list ${v}`);
      }
      cursor[u]++;
    }
  }
  for (let u = 0; u < n; u++) {
    if (cursor[u] !== offsets[u + 1]) {
      const v = neighbours[cursor[u]];
      throw new InputError(`${who}: graph is not symmetric: vertex ${u} lists ${v} but ${v} does not list ${u}`);
    }
  }
}
