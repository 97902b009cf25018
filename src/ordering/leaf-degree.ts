/**
 * Minimum degree for small graphs (the leaf pieces of nested dissection).
 * Method (from memory): minimum degree, Tinney & Walker 1967, "Direct solutions of
 * sparse network equations by optimally ordered triangular factorization", Proc.
 * IEEE 55(11); graph model of elimination (eliminating v turns its remaining
 * neighbours into a clique), Rose 1972, "A graph-theoretic study of the numerical
 * solution of sparse positive definite systems of linear equations"; mass
 * elimination, indistinguishable vertices and external degree as surveyed by
 * George & Liu 1989, "The evolution of the minimum degree ordering algorithm",
 * SIAM Review 31(1).
 *
 * The elimination graph is held explicitly as bitsets: one row of ⌈n/32⌉ words per
 * vertex. Vertices with equal closed neighbourhoods are merged into one
 * supervariable (a representative keeps the row, the others stay as bits in the
 * rows). Eliminating a representative v ORs its clique P (row of v minus its own
 * members) into the row of each representative in P, touching only the words where
 * P or v's members have bits; external degrees (row popcount minus the other
 * members) and row hashes change only there and are updated from the bits that
 * change. Representatives whose row
 * becomes P itself are eliminated with v (mass elimination). Degree buckets are
 * last-in first-out lists. Graphs above {@link LEAF_LIMIT} vertices go to
 * approximate minimum degree.
 *
 * Halo (Pellegrini, Roman & Amestoy 2000, "Hybridizing nested dissection and halo
 * approximate minimum degree for efficient sparse matrix ordering", Concurrency:
 * Practice and Experience 12; from memory): the last vertices may be halo, i.e.
 * neighbours outside a leaf of nested dissection that are numbered after it. They
 * are bits in the rows of the others (so they count in degrees, in mass elimination
 * and in the indistinguishability test) but have no row of their own, no weight and
 * no bucket: they are never pivots and never members of a supervariable.
 */
import type { Graph } from "../graph/types.js";
import { defaultDenseThreshold, minimumDegreeTrusted } from "./minimum-degree.js";

/** Largest graph ordered here; bigger ones fall back to approximate minimum degree. */
export const LEAF_LIMIT = 256;

/** Reusable workspace of {@link leafMinimumDegree} for graphs of up to `capacity` vertices. */
export interface LeafWork {
  readonly capacity: number;
  /** Elimination graph: row v (words [v·W, (v+1)·W), W = ⌈n/32⌉) = live neighbours of v. */
  readonly rows: Int32Array;
  /** Members per representative; 0 once absorbed or eliminated. */
  readonly weight: Int32Array;
  /** Next member in a representative's member list (−1 ends it), and the list's last member. */
  readonly memberNext: Int32Array;
  readonly memberLast: Int32Array;
  /** External degree of each representative, and the degree buckets (doubly linked). */
  readonly degree: Int32Array;
  readonly head: Int32Array;
  readonly next: Int32Array;
  readonly prev: Int32Array;
  /** Hash of each row: the exclusive or of its words. */
  readonly code: Int32Array;
  /** Representatives of the current pivot clique (−1 ends the list), and their closed-row hashes. */
  readonly list: Int32Array;
  readonly keys: Int32Array;
  /** The current pivot clique, the pivot's members, those that join it by mass elimination (one row each),
   * and the words where the clique or the pivot's members have bits (−1 ends the list). */
  readonly clique: Int32Array;
  readonly pivot: Int32Array;
  readonly gone: Int32Array;
  readonly active: Int32Array;
  /** Smallest degree given to a representative by the last elimination step. */
  low: number;
}

/** Workspace for graphs of up to `capacity` (clamped to 1..{@link LEAF_LIMIT}) vertices. */
export function leafWork(capacity: number = LEAF_LIMIT): LeafWork {
  const c = Math.max(1, Math.min(capacity, LEAF_LIMIT)), w = (c + 31) >>> 5;
  const ints = (len: number): Int32Array => new Int32Array(len);
  return {
    capacity: c, rows: ints(c * w), weight: ints(c), memberNext: ints(c),
    memberLast: ints(c), degree: ints(c), head: ints(c), next: ints(c), prev: ints(c), code: ints(c),
    list: ints(c + 1), keys: ints(c), clique: ints(w), pivot: ints(w), gone: ints(w), active: ints(w + 1), low: 0,
  };
}

/**
 * Minimum degree ordering of a small graph (sorted adjacency, no self loops).
 * `work` is reused when its capacity is at least g.n. The last `halo` vertices
 * are halo (see above); only edges between a halo vertex and the others matter.
 * Above {@link LEAF_LIMIT} vertices (halo included) this is
 * `minimumDegreeTrusted(g, defaultDenseThreshold(g.n), true, undefined, halo)`.
 * @returns permutation of the n − halo non-halo vertices, new position → vertex.
 */
export function leafMinimumDegree(g: Graph, work?: LeafWork, halo = 0): Int32Array {
  const n = g.n, m = n - halo;
  if (n > LEAF_LIMIT) return minimumDegreeTrusted(g, defaultDenseThreshold(n), true, undefined, halo);
  const perm = new Int32Array(m);
  if (m === 0) return perm;
  const s = work !== undefined && work.capacity >= n ? work : leafWork(n);
  const w = (n + 31) >>> 5;
  loadGraph(s, g, w, m);
  let k = 0, minDeg = 0;
  while (k < m) {
    while (s.head[minDeg] < 0) minDeg++;
    const v = s.head[minDeg];
    unlink(s, v);
    k = eliminate(s, v, w, perm, k);
    if (s.low < minDeg) minDeg = s.low;
  }
  return perm;
}

/**
 * Fills rows, row hashes, singleton supervariables, degrees and buckets from the
 * adjacency lists of the m non-halo vertices; halo vertices get weight 0 (no row, no bucket).
 */
function loadGraph(s: LeafWork, g: Graph, w: number, m: number): void {
  const { rows, weight, memberNext, memberLast, degree, code } = s, n = g.n, { offsets, neighbours } = g;
  rows.fill(0, 0, m * w);
  s.head.fill(-1, 0, n);
  weight.fill(0, m, n);
  for (let v = m - 1; v >= 0; v--) {
    const base = v * w, end = offsets[v + 1];
    let h = 0;
    for (let p = offsets[v]; p < end; p++) {
      const u = neighbours[p], bit = 1 << (u & 31);
      rows[base + (u >>> 5)] |= bit;
      h ^= bit;
    }
    code[v] = h;
    weight[v] = 1; memberNext[v] = -1; memberLast[v] = v;
    degree[v] = end - offsets[v];
    push(s, v);
  }
}

function push(s: LeafWork, v: number): void {
  const d = s.degree[v], h = s.head[d];
  s.next[v] = h; s.prev[v] = -1;
  if (h >= 0) s.prev[h] = v;
  s.head[d] = v;
}

function unlink(s: LeafWork, v: number): void {
  const p = s.prev[v], q = s.next[v];
  if (p >= 0) s.next[p] = q; else s.head[s.degree[v]] = q;
  if (q >= 0) s.prev[q] = p;
}

/** Appends the members of representative b to those of a; b stops being a representative. */
function absorb(s: LeafWork, a: number, b: number): void {
  s.memberNext[s.memberLast[a]] = b;
  s.memberLast[a] = s.memberLast[b];
  s.weight[a] += s.weight[b];
  s.weight[b] = 0;
}

/**
 * Eliminates representative v (already out of its bucket) with its members and
 * with the representatives it makes indistinguishable from itself; updates the
 * rest of its clique. Writes the order from perm[k]; returns the next free position.
 */
function eliminate(s: LeafWork, v: number, w: number, perm: Int32Array, k: number): number {
  const m = cliqueOf(s, v, w);
  const massed = updateClique(s, v, w);
  if (massed > 0) removeMassed(s, w, massed);
  if (m > 1) mergeIndistinguishable(s, w, m);
  let low = s.capacity;
  for (let j = 0; j < m; j++) {
    const x = s.list[j];
    if (s.weight[x] === 0) continue;
    if (s.degree[x] < low) low = s.degree[x];
    push(s, x);
  }
  s.low = low;
  for (let x = v; x >= 0; x = s.memberNext[x]) perm[k++] = x;
  s.weight[v] = 0;
  return k;
}

/**
 * clique = row(v) minus v's members; lists its representatives and the words
 * where the clique or v's members have bits; returns the number of representatives.
 */
function cliqueOf(s: LeafWork, v: number, w: number): number {
  const { rows, weight, list, clique, pivot, active, gone } = s, vb = v * w;
  for (let i = 0; i < w; i++) { pivot[i] = 0; gone[i] = 0; }
  for (let x = v; x >= 0; x = s.memberNext[x]) pivot[x >>> 5] |= 1 << (x & 31);
  let m = 0, a = 0;
  for (let i = 0; i < w; i++) {
    const own = pivot[i], c = rows[vb + i] & ~own;
    clique[i] = c;
    if ((c | own) !== 0) active[a++] = i;
    let x = c;
    while (x !== 0) {
      const t = x & -x, u = (i << 5) + 31 - Math.clz32(t);
      if (weight[u] > 0) list[m++] = u;
      x ^= t;
    }
  }
  list[m] = -1;
  active[a] = -1;
  return m;
}

/**
 * Adds the clique to the row of each of its representatives, dropping the row's
 * owner and v's members (all of which the row holds), and updates degree and
 * hash from the bits that change. A representative whose row is then the rest of
 * the clique joins v. Returns the weight that joined v.
 */
function updateClique(s: LeafWork, v: number, w: number): number {
  const { rows, weight, list, clique, pivot, active, degree, code } = s, wv = weight[v];
  const size = degree[v]; // |clique|
  let massed = 0;
  for (let j = 0, x = list[0]; x >= 0; x = list[++j]) {
    unlink(s, x);
    const xb = x * w, own = x >>> 5, bit = 1 << (x & 31);
    let added = 0, h = code[x];
    for (let q = 0, i = active[0]; i >= 0; i = active[++q]) {
      const old = rows[xb + i], c = clique[i];
      let r = old & ~pivot[i];
      if (c !== 0) { added += popcount(c & ~old); r |= c; }
      if (i === own) r &= ~bit;
      rows[xb + i] = r;
      h ^= r ^ old;
    }
    code[x] = h;
    const d = degree[x] - wv + added - 1; // added counted x's own bit
    degree[x] = d;
    if (d + weight[x] === size) {
      for (let y = x; y >= 0; y = s.memberNext[y]) s.gone[y >>> 5] |= 1 << (y & 31);
      massed += weight[x];
      absorb(s, v, x);
    }
  }
  return massed;
}

/** Removes the vertices that joined v by mass elimination from the other rows of the clique. */
function removeMassed(s: LeafWork, w: number, massed: number): void {
  const { rows, weight, list, degree, code, gone, active } = s;
  for (let j = 0, x = list[0]; x >= 0; x = list[++j]) {
    if (weight[x] === 0) continue;
    const xb = x * w;
    let h = code[x];
    for (let q = 0, i = active[0]; i >= 0; i = active[++q]) {
      const old = rows[xb + i], r = old & ~gone[i];
      rows[xb + i] = r;
      h ^= r ^ old;
    }
    code[x] = h;
    degree[x] -= massed;
  }
}

/** Merges representatives of the clique whose closed rows are equal (indistinguishable vertices). */
function mergeIndistinguishable(s: LeafWork, w: number, m: number): void {
  const { rows, weight, list, code, degree, keys } = s;
  for (let j = 0; j < m; j++) {
    const x = list[j];
    keys[j] = code[x] ^ (1 << (x & 31)); // hash of the closed row
  }
  for (let a = 0; a < m; a++) {
    const x = list[a], hx = keys[a];
    if (weight[x] === 0) continue;
    const xb = x * w, xo = x >>> 5, xbit = 1 << (x & 31);
    for (let b = a + 1; b < m; b++) {
      if (keys[b] !== hx) continue;
      const y = list[b];
      if (weight[y] === 0 || degree[y] + weight[y] !== degree[x] + weight[x]) continue;
      const yb = y * w, yo = y >>> 5, ybit = 1 << (y & 31);
      let same = true;
      for (let i = 0; i < w && same; i++) {
        same = (i === xo ? rows[xb + i] | xbit : rows[xb + i]) === (i === yo ? rows[yb + i] | ybit : rows[yb + i]);
      }
      if (!same) continue;
      degree[x] -= weight[y];
      absorb(s, x, y);
    }
  }
}

function popcount(x: number): number {
  x -= (x >>> 1) & 0x55555555;
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return Math.imul((x + (x >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24;
}
