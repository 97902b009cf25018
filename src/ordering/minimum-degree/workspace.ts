/**
 * Workspace of the approximate minimum degree ordering (Amestoy, Davis & Duff
 * 1996, SIAM J. Matrix Anal. Appl. 17(4)): the quotient graph held in one
 * Int32Array arena, plus one record of {@link Field.Count} int32 fields per
 * node, side by side in `node` so that one cache line serves every field of a
 * node. Also the degree buckets and the arena compaction (garbage collection)
 * used when the arena fills up.
 *
 * Each node j owns the list arena[Start .. Start + Size) (fields of j's record).
 * For a variable, its first Elements entries are adjacent elements, the rest
 * adjacent variables. For an element, the list holds the variables of its
 * clique. Start = -1 means "no list" (dead, merged, eliminated, or empty).
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

/** Fields of a node's record: field f of node j is node[j * Field.Count + f]. */
export const enum Field {
  /** Arena position of the node's list, -1 when it has none. */
  Start,
  /** Length of the list. */
  Size,
  /** Variables: how many entries at the front of the list are elements. */
  Elements,
  /** Supervariable weight while a variable; negated while in the current pivot element; 0 otherwise. */
  Weight,
  /** Approximate external degree of a non-halo variable; weighted clique size of an element. */
  Degree,
  /**
   * Degree-bucket links of a variable. While the variables of a new clique
   * are out of their buckets, Next chains them by hash and Prev holds their hash key.
   */
  Next,
  Prev,
  /** mark0 + |Le \ Lme| for elements during an update, list marks for supervariable tests; 0: absorbed element. */
  Mark,
  /** Fields per record. */
  Count,
}

/** Most buckets of the supervariable hash table (a power of two): 256 KiB, larger cliques share buckets. */
const HASH_TABLE_MAX = 2 ** 16;

export class MdWorkspace {
  readonly n: number;
  /** Vertices firstHalo .. n−1 are halo (never ordered). */
  readonly firstHalo: number;
  arena: Int32Array;
  /** Next free slot of the arena. */
  free: number;
  /** The node records, {@link Field.Count} fields each. */
  readonly node: Int32Array;
  /** Heads of the degree buckets: doubly linked lists (fields Next, Prev) of variables by approximate degree. */
  readonly bucketHead: Int32Array;
  minDegree = 0;
  /**
   * Mark base. A round writes marks below mark0 + maxElement + |Lme| ≤ mark0 + 2n + 1,
   * so the marks are reset once mark0 passes markLimit.
   */
  mark0 = MARK_START;
  readonly markLimit: number;
  /** Largest weighted clique size of any element so far (bounds the Degree of every element). */
  maxElement = 0;
  /** Hash buckets for finding indistinguishable variables (a power of two, at most HASH_TABLE_MAX). */
  readonly hashHead: Int32Array;
  /**
   * Members of each supervariable as a chain from the principal variable, as
   * long as its weight; memberTail is the last member. Only supervariables of
   * weight above 1 read them, so neither array is initialised.
   */
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
    this.node = initialRecords(graph);
    this.bucketHead = new Int32Array(n + 1).fill(-1);
    this.markLimit = 2 ** 31 - 1 - 2 * (n + 1);
    this.hashHead = new Int32Array(Math.min(HASH_TABLE_MAX, 2 ** (32 - Math.clz32(Math.max(1, n))))).fill(-1);
    this.memberNext = new Int32Array(n);
    this.memberTail = new Int32Array(n);
    this.order = new Int32Array(n - halo);
  }
}

/** Records of the graph's vertices as variables of weight 1, degree = neighbour count, lists in place, marks 1 (live). */
function initialRecords(graph: Graph): Int32Array {
  const { n, offsets } = graph;
  const node = new Int32Array(n * Field.Count);
  for (let j = 0, b = 0; j < n; j++, b += Field.Count) {
    node[b + Field.Start] = offsets[j];
    node[b + Field.Size] = offsets[j + 1] - offsets[j];
    node[b + Field.Degree] = offsets[j + 1] - offsets[j];
    node[b + Field.Weight] = 1;
    node[b + Field.Mark] = 1;
  }
  return node;
}

/** Put variable i in the bucket of degree d. */
export function bucketInsert(s: MdWorkspace, i: number, d: number): void {
  const node = s.node;
  const bi = i * Field.Count;
  const head = s.bucketHead[d];
  node[bi + Field.Next] = head;
  node[bi + Field.Prev] = -1;
  if (head !== -1) node[head * Field.Count + Field.Prev] = i;
  s.bucketHead[d] = i;
  node[bi + Field.Degree] = d;
  if (d < s.minDegree) s.minDegree = d;
}

/** Take variable i out of its degree bucket. */
export function bucketRemove(s: MdWorkspace, i: number): void {
  const node = s.node;
  const bi = i * Field.Count;
  const next = node[bi + Field.Next];
  const prev = node[bi + Field.Prev];
  if (next !== -1) node[next * Field.Count + Field.Prev] = prev;
  if (prev !== -1) node[prev * Field.Count + Field.Next] = next;
  else s.bucketHead[node[bi + Field.Degree]] = next;
}

/** Append the members of supervariable i, of weight w, to the order. */
export function emitMembers(s: MdWorkspace, i: number, w: number): void {
  const { order, memberNext } = s;
  let k = s.ordered;
  order[k++] = i;
  for (let j = i, m = 1; m < w; m++) order[k++] = j = memberNext[j];
  s.ordered = k;
}

/** Fold the member chain of b (weight wb) behind that of a (weight wa): b becomes part of supervariable a. */
export function joinMembers(s: MdWorkspace, a: number, wa: number, b: number, wb: number): void {
  s.memberNext[wa === 1 ? a : s.memberTail[a]] = b;
  s.memberTail[a] = wb === 1 ? b : s.memberTail[b];
}

/**
 * Compaction: slide every live list to the front of the arena, then move the
 * partly built element arena[pending .. s.free) behind them. Each live list
 * is tagged by replacing its first entry with -(owner+1), the entry saved in
 * the owner's Start field; a single sweep then finds the lists in arena order.
 * Returns the new position of the pending block. Grows the arena when
 * compaction alone leaves less than `room` free slots.
 */
export function compact(s: MdWorkspace, pending: number, room: number): number {
  const { n, node } = s;
  let arena = s.arena;
  for (let j = 0, bj = 0; j < n; j++, bj += Field.Count) {
    const p = node[bj + Field.Start];
    if (p < 0) continue;
    if (node[bj + Field.Size] === 0) {
      node[bj + Field.Start] = -1;
      continue;
    }
    node[bj + Field.Start] = arena[p];
    arena[p] = -(j + 1);
  }
  let dst = 0;
  let src = 0;
  while (src < pending) {
    const tag = arena[src++];
    if (tag >= 0) continue;
    const bj = (-tag - 1) * Field.Count;
    arena[dst] = node[bj + Field.Start];
    node[bj + Field.Start] = dst++;
    const stop = src + node[bj + Field.Size] - 1;
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
