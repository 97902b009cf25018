/**
 * Workspace of the approximate minimum degree ordering (Amestoy, Davis & Duff
 * 1996, SIAM J. Matrix Anal. Appl. 17(4)): the quotient graph held in one
 * Int32Array arena, plus per-node arrays. Also the degree buckets and the
 * arena compaction (garbage collection) used when the arena fills up.
 *
 * Each node j owns the list arena[start[j] .. start[j] + size[j]). For a
 * variable, its first elementCount[j] entries are adjacent elements, the rest
 * adjacent variables. For an element, the list holds the variables of its
 * clique. start[j] = -1 means "no list" (dead, merged, eliminated, or empty).
 *
 * Halo (Pellegrini, Roman & Amestoy 2000, "Hybridizing nested dissection and
 * halo approximate minimum degree for efficient sparse matrix ordering",
 * Concurrency: Practice and Experience 12; from memory): the vertices from
 * firstHalo on are variables that count in degrees but are never pivots: they
 * stay out of the degree buckets and never join a non-halo supervariable.
 */
import type { Graph } from "../../graph/types.js";

/** First mark base; every stored mark is 1 (live), 0 (absorbed element) or at least this. */
export const MARK_START = 2;

/** Most buckets of the supervariable hash table (a power of two): 256 KiB, larger cliques share buckets. */
const HASH_TABLE_MAX = 2 ** 16;

export class MdWorkspace {
  readonly n: number;
  /** Vertices firstHalo .. n−1 are halo (never ordered). */
  readonly firstHalo: number;
  arena: Int32Array;
  /** Next free slot of the arena. */
  free: number;
  readonly start: Int32Array;
  readonly size: Int32Array;
  readonly elementCount: Int32Array;
  /** Supervariable weight while a variable; negated while in the current pivot element; 0 otherwise. */
  readonly weight: Int32Array;
  /** Approximate external degree of a non-halo variable; weighted clique size of an element. */
  readonly degree: Int32Array;
  /**
   * Degree buckets: doubly linked lists of variables by approximate degree.
   * While the variables of a new clique are out of their buckets, bucketNext
   * chains them by hash and bucketPrev holds their hash key.
   */
  readonly bucketHead: Int32Array;
  readonly bucketNext: Int32Array;
  readonly bucketPrev: Int32Array;
  minDegree = 0;
  /** Marks: |Le \ Lme| + mark0 for elements during an update, list marks for supervariable tests. */
  readonly mark: Int32Array;
  /**
   * Mark base. A round writes marks below mark0 + maxElement + |Lme| ≤ mark0 + 2n + 1,
   * so the marks are reset once mark0 passes markLimit.
   */
  mark0 = MARK_START;
  readonly markLimit: number;
  /** Largest weighted clique size of any element so far (bounds degree[e] of every element). */
  maxElement = 0;
  /** Hash buckets for finding indistinguishable variables (a power of two, at most HASH_TABLE_MAX). */
  readonly hashHead: Int32Array;
  /** Members of each supervariable as a chain, so they are emitted together. */
  readonly memberNext: Int32Array;
  readonly memberTail: Int32Array;
  /** The permutation under construction (new → old) of the non-halo vertices. */
  readonly order: Int32Array;
  ordered = 0;
  /** Total weight eliminated (pivots, merged, mass eliminated, set aside). */
  eliminated = 0;

  /**
   * `slack`: arena slots beyond the graph's entries (default nnz/5 + 2n + 16); compaction and growth handle any value.
   * `halo`: how many of the last vertices are halo.
   */
  constructor(graph: Graph, slack?: number, halo = 0) {
    const n = graph.n;
    const nnz = graph.offsets[n];
    this.n = n;
    this.firstHalo = n - halo;
    this.arena = new Int32Array(nnz + (slack ?? Math.ceil(nnz / 5) + 2 * n + 16));
    this.arena.set(graph.neighbours.subarray(0, nnz));
    this.free = nnz;
    this.start = Int32Array.from(graph.offsets.subarray(0, n));
    this.size = new Int32Array(n);
    for (let j = 0; j < n; j++) this.size[j] = graph.offsets[j + 1] - graph.offsets[j];
    this.elementCount = new Int32Array(n);
    this.weight = new Int32Array(n).fill(1);
    this.degree = new Int32Array(n);
    this.bucketHead = new Int32Array(n + 1).fill(-1);
    this.bucketNext = new Int32Array(n);
    this.bucketPrev = new Int32Array(n);
    this.mark = new Int32Array(n).fill(1);
    this.markLimit = 2 ** 31 - 1 - 2 * (n + 1);
    this.hashHead = new Int32Array(Math.min(HASH_TABLE_MAX, 2 ** (32 - Math.clz32(Math.max(1, n))))).fill(-1);
    this.memberNext = new Int32Array(n).fill(-1);
    this.memberTail = new Int32Array(n);
    for (let j = 0; j < n; j++) this.memberTail[j] = j;
    this.order = new Int32Array(n - halo);
  }
}

/** Put variable i in the bucket of degree d. */
export function bucketInsert(s: MdWorkspace, i: number, d: number): void {
  const head = s.bucketHead[d];
  s.bucketNext[i] = head;
  s.bucketPrev[i] = -1;
  if (head !== -1) s.bucketPrev[head] = i;
  s.bucketHead[d] = i;
  s.degree[i] = d;
  if (d < s.minDegree) s.minDegree = d;
}

/** Take variable i out of its degree bucket. */
export function bucketRemove(s: MdWorkspace, i: number): void {
  const next = s.bucketNext[i];
  const prev = s.bucketPrev[i];
  if (next !== -1) s.bucketPrev[next] = prev;
  if (prev !== -1) s.bucketNext[prev] = next;
  else s.bucketHead[s.degree[i]] = next;
}

/** Append the members of supervariable i to the order. */
export function emitMembers(s: MdWorkspace, i: number): void {
  const { order, memberNext } = s;
  let k = s.ordered;
  for (let j = i; j !== -1; j = memberNext[j]) order[k++] = j;
  s.ordered = k;
}

/** Fold the member chain of b into that of a (b becomes part of supervariable a). */
export function joinMembers(s: MdWorkspace, a: number, b: number): void {
  s.memberNext[s.memberTail[a]] = b;
  s.memberTail[a] = s.memberTail[b];
}

/**
 * Compaction: slide every live list to the front of the arena, then move the
 * partly built element arena[pending .. s.free) behind them. Each live list
 * is tagged by replacing its first entry with -(owner+1), the entry saved in
 * start[owner]; a single sweep then finds the lists in arena order.
 * Returns the new position of the pending block. Grows the arena when
 * compaction alone leaves less than `room` free slots.
 */
export function compact(s: MdWorkspace, pending: number, room: number): number {
  const { n, start, size } = s;
  let arena = s.arena;
  for (let j = 0; j < n; j++) {
    const p = start[j];
    if (p < 0) continue;
    if (size[j] === 0) {
      start[j] = -1;
      continue;
    }
    start[j] = arena[p];
    arena[p] = -(j + 1);
  }
  let dst = 0;
  let src = 0;
  while (src < pending) {
    const tag = arena[src++];
    if (tag >= 0) continue;
    const j = -tag - 1;
    arena[dst] = start[j];
    start[j] = dst++;
    const stop = src + size[j] - 1;
    while (src < stop) arena[dst++] = arena[src++];
  }
  const moved = dst;
  arena.copyWithin(dst, pending, s.free);
  s.free = dst + (s.free - pending);
  if (arena.length - s.free < room) {
    const bigger = new Int32Array(Math.max(arena.length + (arena.length >> 1), s.free + room + 16));
    bigger.set(arena.subarray(0, s.free));
    s.arena = arena = bigger;
  }
  return moved;
}
