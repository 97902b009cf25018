/**
 * The pieces of a nested dissection (George 1973, "Nested dissection of a
 * regular finite element mesh", SIAM J. Numer. Anal. 10(2)) and how each is
 * processed. Pieces are processed from an explicit stack (no recursion): a
 * piece is split into its connected components, a large connected piece is cut
 * by a vertex separator numbered last in its range, and pieces below the leaf
 * size are ordered by the supplied leaf ordering (minimum degree). Produces the
 * separator tree in the new numbering. A leaf is ordered together with its halo,
 * its neighbours in the ancestors' separators, which are numbered after it and
 * count in the degrees of the leaf's vertices (halo minimum degree: Pellegrini,
 * Roman & Amestoy 2000, "Hybridizing nested dissection and halo approximate
 * minimum degree for efficient sparse matrix ordering", Concurrency: Practice and
 * Experience 12; from memory). Shapes that dissection handles badly are
 * treated first: dense rows over a tree-like rest are set aside and numbered
 * last (dense.ts), forest pieces are postordered and trees hanging from the
 * input graph are kept out of the cuts (hairs.ts).
 */
import type { Graph } from "../../graph/types.js";
import type { Coordinates } from "../coordinates.js";
import { coordinateCut } from "../coordinates.js";
import type { SeparatorTree } from "../types.js";
import {
  lighter, multilevelSeparator, refineGiven, separate, type BisectOptions, type SecondStartElsewhere,
} from "./multilevel.js";
import { complement, denseVertices } from "./dense.js";
import { isForest, peelHairs, treePostorder } from "./hairs.js";
import type { FmWork } from "./refine.js";
import { Rng } from "./rng.js";
import { componentGraph, inducedSubgraph, splitSide, type SideSplit, type WGraph } from "./wgraph.js";

/** How the cuts are found when coordinates are given. */
export type CoordinateMode = "refine" | "plain" | "ignore";

/**
 * Orders one leaf piece: g (sorted adjacency) is the leaf followed by its `halo`
 * vertices (neighbours outside the leaf, numbered after it; only their edges to
 * the leaf are listed). Returns new → old for the g.n − halo leaf vertices.
 */
export type LeafOrdering = (g: Graph, halo: number) => Int32Array;

interface Piece {
  graph: WGraph;
  ids: Int32Array;
  lo: number;
  parent: number;
  leaf: boolean;
}

/** A piece on the stack: graph null for a leaf that is not a forest (only its ids are read). */
export type Pending = Omit<Piece, "graph"> & { graph: WGraph | null };

/** What decides how a piece is cut: the same on every thread of one dissection. */
export interface Settings {
  seed: number;
  leafSize: number;
  bisect: BisectOptions;
  coordinates: Coordinates | undefined;
  coordinateMode: CoordinateMode;
  /** Total vertex weight of the input graph. */
  wholeWeight: number;
}

export interface State {
  perm: Int32Array;
  first: number[];
  sepFirst: number[];
  end: number[];
  parent: number[];
  stack: Pending[];
  placed: number;
  set: Settings;
  orderLeaf: LeafOrdering;
  work: FmWork;
  /**
   * All -1 between uses: a vertex → position map, for inducedSubgraph (ids of
   * the graph being split) and for the leaf + halo graph (ids of the input graph).
   */
  localOf: Int32Array;
  /** Input hairs: the vertex each hangs from (itself for the others); null when there are none. */
  hairRoot: Int32Array | null;
  /** Position in the piece's core of each vertex (valid for the piece being cut). */
  coreAt: Int32Array;
  /** The input graph; the pieces' ids are its vertices. */
  top: Graph;
  /** All 0 between uses: edges to the leaf of each halo vertex, then fill cursors. */
  haloCount: Int32Array;
  /** Edge weights all ones, at least as long as any piece's lists: unit-weight pieces' edge weights are views of it. */
  ones: Int32Array;
}

/**
 * Empty state for dissecting pieces of `top`; `work` is sized for the largest
 * piece, `ones` as long as its lists, `hairRoot` as {@link setHairs} finds it.
 */
export function newState(top: Graph, set: Settings, orderLeaf: LeafOrdering, work: FmWork, ones: Int32Array, hairRoot: Int32Array | null): State {
  const n = top.n;
  return {
    perm: new Int32Array(n), first: [], sepFirst: [], end: [], parent: [], stack: [], placed: 0, set, orderLeaf, work,
    localOf: new Int32Array(n).fill(-1), hairRoot, coreAt: new Int32Array(hairRoot === null ? 0 : n), top, haloCount: new Int32Array(n), ones,
  };
}

/**
 * Processes pieces from the stack until it is empty; `tick` runs before each
 * piece and once at the end (progress, abort checks; it may throw).
 */
export function drain(s: State, tick: () => void): void {
  while (s.stack.length > 0) {
    tick();
    processPiece(s, s.stack.pop()!);
  }
  tick();
}

/**
 * Numbers the dense vertices last, as the separator of a root node over the
 * whole range, and returns the rest of the graph with its vertex ids and that
 * node (-1 and the whole graph when nothing is dense).
 */
export function setAsideDense(s: State, whole: WGraph): { g: WGraph; ids: Int32Array; root: number } {
  const n = whole.n;
  const dense = denseVertices(whole);
  if (dense === null) {
    const ids = new Int32Array(n);
    for (let v = 0; v < n; v++) ids[v] = v;
    return { g: whole, ids, root: -1 };
  }
  s.perm.set(dense, n - dense.length);
  s.placed += dense.length;
  const ids = complement(n, dense);
  return { g: inducedSubgraph(whole, ids, s.localOf), ids, root: addNode(s, 0, n - dense.length, n, -1) };
}

/** Finds the input hairs of g (vertex ids `ids`) and sets s.hairRoot and its workspace s.coreAt. */
export function setHairs(s: State, g: WGraph, ids: Int32Array): void {
  s.hairRoot = hairRoots(g, ids, s.top.n);
  s.coreAt = new Int32Array(s.hairRoot === null ? 0 : s.top.n);
}

/** Input hairs of g (vertex ids `ids` among n) as a map over all n ids; null when there are none or g is a forest (all postordered). */
function hairRoots(g: WGraph, ids: Int32Array, n: number): Int32Array | null {
  const hairs = isForest(g) ? null : peelHairs(g);
  if (hairs === null) return null;
  const root = new Int32Array(n);
  for (let v = 0; v < n; v++) root[v] = v;
  for (let i = 0; i < g.n; i++) root[ids[i]] = ids[hairs.root[i]];
  return root;
}

export function addNode(s: State, first: number, sepFirst: number, end: number, parent: number): number {
  s.first.push(first); s.sepFirst.push(sepFirst); s.end.push(end); s.parent.push(parent);
  return s.first.length - 1;
}

/** Cuts or orders one piece; `elsewhere`, when given, refines a second start of its cut on another thread. */
export function processPiece(s: State, pending: Pending, elsewhere?: SecondStartElsewhere): void {
  const g = pending.graph;
  if (g === null) {
    placeLeaf(s, pending);
    return;
  }
  const piece: Piece = { ...pending, graph: g };
  if (isForest(g)) {
    placeLeaf(s, piece, treePostorder(g, attachedVertices(s, piece)) ?? undefined);
    return;
  }
  if (piece.leaf || g.n <= s.set.leafSize) {
    placeLeaf(s, piece);
    return;
  }
  const label = cutPiece(s, piece, elsewhere);
  const sepCount = label === null ? 0 : separatorSize(label);
  if (label === null || sepCount === 0 || sepCount === g.n) {
    placeLeaf(s, piece);
    return;
  }
  const hi = piece.lo + g.n;
  const node = addNode(s, piece.lo, hi - sepCount, hi, piece.parent);
  placeSeparator(s.perm, hi - sepCount, label, piece.ids);
  s.placed += sepCount;
  const mid = pushComponents(s, g, piece.ids, label, 0, piece.lo, node);
  pushComponents(s, g, piece.ids, label, 1, mid, node);
}

// Loops over a whole piece sit in small functions of their own here and below:
// V8 compiles a long loop on the fly, and code after such a loop in the same
// function, compiled before it ever ran, was deoptimized on every call.

function separatorSize(label: Int8Array): number {
  let count = 0;
  for (let v = 0; v < label.length; v++) if (label[v] === 2) count++;
  return count;
}

/** Writes the separator's vertices (ids of the input graph) to perm from position k on. */
function placeSeparator(perm: Int32Array, k: number, label: Int8Array, ids: Int32Array): void {
  for (let v = 0; v < label.length; v++) if (label[v] === 2) perm[k++] = ids[v];
}

/** Marks the vertices of the piece with neighbours outside it (in separators above, or set aside). */
function attachedVertices(s: State, piece: Piece): Uint8Array {
  const { graph: g, ids } = piece;
  const { offsets } = s.top;
  const attached = new Uint8Array(g.n);
  for (let v = 0; v < g.n; v++) {
    if (offsets[ids[v] + 1] - offsets[ids[v]] > g.offsets[v + 1] - g.offsets[v]) attached[v] = 1;
  }
  return attached;
}

/**
 * Separator labels of a piece. Hairs of the input graph (trees hanging from
 * single vertices, found once at the start) are set aside and the rest is
 * cut, each hair's weight counting on the vertex it hangs from; a hair then
 * joins that vertex's part, or the lighter part when the vertex is in the
 * separator (it becomes a component of its own there). Only input hairs are
 * set aside: vertices left with one neighbour by earlier cuts were measured to
 * be useful separator material (+2–4 % flops on grids when peeled too).
 * Null when the rest is no larger than a leaf: the piece is then a leaf.
 */
function cutPiece(s: State, piece: Piece, elsewhere?: SecondStartElsewhere): Int8Array | null {
  const { graph: g, ids } = piece;
  const rng = pieceRng(s.set.seed, piece.lo, g.n);
  const core = s.hairRoot === null ? null : coreVertices(s.hairRoot, ids);
  if (core === null || core.length === g.n) return findSeparator(s, piece, rng, elsewhere);
  if (core.length <= s.set.leafSize) return null;
  const graph = coreGraph(s, piece, core);
  return spreadToHairs(s, ids, findSeparator(s, { ...piece, graph, ids: gather(ids, core) }, rng, elsewhere), graph.vertexWeight);
}

/** The 32-bit finalizer of MurmurHash3 (Appleby 2008): every input bit reaches every output bit. */
function mix32(x: number): number {
  x ^= x >>> 16;
  x = Math.imul(x, 0x85ebca6b);
  x ^= x >>> 13;
  x = Math.imul(x, 0xc2b2ae35);
  return x ^ (x >>> 16);
}

/**
 * The random stream of the piece at positions lo .. lo + n: drawn from the seed
 * and the piece's place alone, so a piece is cut the same way whatever order
 * the pieces are processed in, or on whichever thread.
 */
export function pieceRng(seed: number, lo: number, n: number): Rng {
  return new Rng(mix32(mix32(mix32(seed | 0) ^ lo) ^ n));
}

/** The piece's vertices (local ids, ascending) that are not input hairs. */
function coreVertices(hairRoot: Int32Array, ids: Int32Array): Int32Array {
  let count = 0;
  for (let v = 0; v < ids.length; v++) if (hairRoot[ids[v]] === ids[v]) count++;
  const core = new Int32Array(count);
  for (let v = 0, c = 0; v < ids.length; v++) if (hairRoot[ids[v]] === ids[v]) core[c++] = v;
  return core;
}

/** The subgraph of the core, each hair's weight added to the vertex it hangs from; sets s.coreAt for the core. */
function coreGraph(s: State, piece: Piece, core: Int32Array): WGraph {
  const { graph: g, ids } = piece;
  const hairRoot = s.hairRoot!, at = s.coreAt;
  for (let i = 0; i < core.length; i++) at[ids[core[i]]] = i;
  const induced = inducedSubgraph(g, core, s.localOf);
  const weight = induced.vertexWeight;
  for (let v = 0; v < g.n; v++) if (hairRoot[ids[v]] !== ids[v]) weight[at[hairRoot[ids[v]]]] += g.vertexWeight[v];
  let max = 0;
  for (let i = 0; i < core.length; i++) if (weight[i] > max) max = weight[i];
  return { ...induced, totalWeight: g.totalWeight, maxVertexWeight: max };
}

/** Labels of the whole piece from the core's: a hair takes its root's part, or the lighter part when the root is in the separator. */
function spreadToHairs(s: State, ids: Int32Array, coreLabel: Int8Array, weight: Int32Array): Int8Array {
  const hairRoot = s.hairRoot!, at = s.coreAt;
  let w0 = 0;
  let w1 = 0;
  for (let i = 0; i < coreLabel.length; i++) {
    if (coreLabel[i] === 0) w0 += weight[i]; else if (coreLabel[i] === 1) w1 += weight[i];
  }
  const label = new Int8Array(ids.length);
  for (let v = 0; v < ids.length; v++) {
    const l = coreLabel[at[hairRoot[ids[v]]]];
    label[v] = hairRoot[ids[v]] === ids[v] || l !== 2 ? l : w0 <= w1 ? 0 : 1;
  }
  return label;
}

/**
 * Separator of a piece. With coordinates: "plain" takes the coordinate cut's
 * one-sided boundary as is; "refine" (default) refines the coordinate cut like
 * a multilevel one and keeps the lighter of it and the multilevel separator
 * (offering the plain cut as a third candidate was measured worse on 2-D grids).
 */
function findSeparator(s: State, piece: Piece, rng: Rng, elsewhere?: SecondStartElsewhere): Int8Array {
  const { graph: g, ids } = piece;
  const { coordinates: c, coordinateMode: mode, bisect, wholeWeight } = s.set;
  if (c === undefined || mode === "ignore") return multilevelSeparator(g, rng, bisect, s.work, wholeWeight, elsewhere);
  const cut = coordinateCut(g, ids, c);
  if (mode === "plain") return separate(g, cut, { ...bisect, separatorRefinement: "none" }, s.work);
  const refined = separate(g, refineGiven(g, cut, bisect, s.work), bisect, s.work);
  return lighter(g, refined, multilevelSeparator(g, rng, bisect, s.work, wholeWeight, elsewhere));
}

/**
 * Pushes the connected components of the vertices labelled `which` (all when
 * label is null) as pieces starting at position lo; small components are
 * batched into leaf pieces. Returns the position after the last one.
 */
export function pushComponents(s: State, g: WGraph, ids: Int32Array, label: Int8Array | null, which: number, lo: number, parent: number): number {
  const split = splitSide(g, label, which, s.localOf, s.work.arenas, s.ones);
  const { starts } = split;
  let batchStart = -1;
  let pos = lo;
  for (let c = 0; c + 1 < starts.length; c++) {
    const size = starts[c + 1] - starts[c];
    if (size > s.set.leafSize) {
      if (batchStart >= 0) { pos = pushBatch(s, g, ids, split, batchStart, starts[c], pos, parent); batchStart = -1; }
      s.stack.push({ graph: componentGraph(g, split, c), ids: gather(ids, split.order.subarray(starts[c], starts[c + 1])), lo: pos, parent, leaf: false });
      pos += size;
      continue;
    }
    if (batchStart < 0) batchStart = starts[c];
    if (starts[c + 1] - batchStart >= s.set.leafSize) { pos = pushBatch(s, g, ids, split, batchStart, starts[c + 1], pos, parent); batchStart = -1; }
  }
  if (batchStart >= 0) pos = pushBatch(s, g, ids, split, batchStart, starts[starts.length - 1], pos, parent);
  return pos;
}

/**
 * Pushes the leaf piece of the split's vertices at positions from .. to
 * (whole components) at position `pos`; returns the position after it. Its
 * graph is built only when the piece may be a forest (fewer edges than
 * vertices), the one case where it is read: other leaves are ordered from the
 * input graph.
 */
function pushBatch(s: State, g: WGraph, ids: Int32Array, split: SideSplit, from: number, to: number, pos: number, parent: number): number {
  const verts = split.order.subarray(from, to);
  const forest = split.offsets[to] - split.offsets[from] < 2 * verts.length;
  s.stack.push({ graph: forest ? inducedSubgraph(g, verts, s.localOf) : null, ids: gather(ids, verts), lo: pos, parent, leaf: true });
  return pos + verts.length;
}

/** ids[verts[i]] for every i. */
function gather(ids: Int32Array, verts: Int32Array): Int32Array {
  const out = new Int32Array(verts.length);
  for (let i = 0; i < verts.length; i++) out[i] = ids[verts[i]];
  return out;
}

/** Orders a leaf piece (by the leaf ordering with its halo unless `perm` is given) and records a leaf node. */
function placeLeaf(s: State, piece: Pending, perm?: Int32Array): void {
  const n = piece.ids.length;
  if (perm === undefined) {
    const { graph, halo } = leafWithHalo(s, piece.ids);
    perm = s.orderLeaf(graph, halo);
  }
  if (perm.length !== n) throw new Error(`nested dissection: the leaf ordering returned ${perm.length} of ${n} vertices`);
  s.perm.set(gather(piece.ids, perm), piece.lo);
  s.placed += n;
  addNode(s, piece.lo, piece.lo + n, piece.lo + n, piece.parent);
}

/**
 * The leaf `ids` (vertices of the input graph) followed by its halo: the outside
 * neighbours, in order of first appearance, listing only their edges to the leaf.
 * Adjacency lists sorted ascending. One pass over the leaf's lists in the input graph.
 */
function leafWithHalo(s: State, ids: Int32Array): { graph: Graph; halo: number } {
  const { offsets, neighbours } = s.top;
  const { localOf: at, haloCount: count } = s;
  const n = ids.length;
  let halo = 0, leafEntries = 0, haloEntries = 0;
  for (let i = 0; i < n; i++) at[ids[i]] = i;
  const haloIds: number[] = [];
  for (let i = 0; i < n; i++) {
    const v = ids[i];
    leafEntries += offsets[v + 1] - offsets[v];
    for (let p = offsets[v]; p < offsets[v + 1]; p++) {
      const u = neighbours[p];
      if (at[u] < 0) { at[u] = n + halo++; haloIds.push(u); }
      if (at[u] >= n) { count[at[u] - n]++; haloEntries++; }
    }
  }
  const off = new Int32Array(n + halo + 1);
  const adj = new Int32Array(leafEntries + haloEntries);
  let q = 0;
  for (let i = 0; i < n; i++) {
    const v = ids[i], from = q, short = offsets[v + 1] - offsets[v] <= 16;
    for (let p = offsets[v]; p < offsets[v + 1]; p++) {
      const u = at[neighbours[p]];
      let j = q++; // short lists: insertion sort as they are filled
      if (short) for (; j > from && adj[j - 1] > u; j--) adj[j] = adj[j - 1];
      adj[j] = u;
    }
    if (!short) adj.subarray(from, q).sort();
    off[i + 1] = q;
  }
  for (let h = 0; h < halo; h++) { off[n + h + 1] = off[n + h] + count[h]; count[h] = off[n + h]; }
  for (let i = 0; i < n; i++) {
    const v = ids[i];
    for (let p = offsets[v]; p < offsets[v + 1]; p++) { const l = at[neighbours[p]]; if (l >= n) adj[count[l - n]++] = i; }
  }
  for (let i = 0; i < n; i++) at[ids[i]] = -1;
  for (let h = 0; h < halo; h++) { at[haloIds[h]] = -1; count[h] = 0; }
  return { graph: { n: n + halo, offsets: off, neighbours: adj }, halo };
}

/**
 * Nodes in order of their range's end: a node's descendants end inside its
 * range before its non-empty separator, so children come before parents, and
 * the order does not depend on the order the pieces were processed in.
 */
export function buildTree(s: State): SeparatorTree {
  const count = s.first.length;
  const order = Array.from({ length: count }, (_, i) => i).sort((a, b) => s.end[a] - s.end[b]);
  const at = new Int32Array(count);
  for (let j = 0; j < count; j++) at[order[j]] = j;
  const first = new Int32Array(count);
  const separatorFirst = new Int32Array(count);
  const end = new Int32Array(count);
  const parent = new Int32Array(count);
  for (let j = 0; j < count; j++) {
    const i = order[j];
    first[j] = s.first[i];
    separatorFirst[j] = s.sepFirst[i];
    end[j] = s.end[i];
    parent[j] = s.parent[i] < 0 ? -1 : at[s.parent[i]];
  }
  return { count, first, separatorFirst, end, parent };
}
