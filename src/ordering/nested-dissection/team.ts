/**
 * Sharing the pieces of one dissection among threads (subtree-to-thread
 * mapping, Pothen & Sun 1993, SIAM J. Sci. Comput. 14(5)): this thread cuts
 * the heaviest pieces until the open ones fall into groups of about equal
 * weight (largest first into the lightest group: Graham 1969, "Bounds on
 * multiprocessing timing anomalies", SIAM J. Appl. Math. 17(2)), keeps the
 * lightest group and hands each other group to a helper. A piece's cut depends
 * only on the seed and its place, so the helpers' results are the ones this
 * thread would have found; a helper that fails has its pieces redone here.
 */
import { AbortedError } from "../../errors.js";
import type { Graph } from "../../graph/types.js";
import { secondStartOnly, type SecondStartElsewhere } from "./multilevel.js";
import { addNode, drain, newState, pieceRng, processPiece, type LeafOrdering, type Pending, type Settings, type State } from "./pieces.js";
import { fmWork, type FmWork } from "./refine.js";
import {
  askForPiece, awaitEvent, defaultHelperScript, helperPlaced, releaseHelper, sendJob, signal, Slot, takeHelper, takeMessage, type Helper,
} from "./threads.js";
import type { WGraph } from "./wgraph.js";

/** A helper, the pieces handed to it and whether its result is still awaited. */
export interface Member {
  helper: Helper;
  pieces: Pending[];
  working: boolean;
}

/** What a helper is started with: the input graph, its hairs and the settings. */
export interface HelperInit {
  offsets: Int32Array;
  neighbours: Int32Array;
  hairRoot: Int32Array | null;
  settings: Settings;
}

/** A weighted graph as sent between threads. */
export interface GraphMessage {
  n: number;
  offsets: Int32Array;
  neighbours: Int32Array;
  /** Null for unit edge weights. */
  edgeWeight: Int32Array | null;
  vertexWeight: Int32Array;
  totalWeight: number;
  maxVertexWeight: number;
}

/** A piece as sent between threads; see {@link toMessage} for `parent`. */
export interface PieceMessage extends GraphMessage {
  ids: Int32Array;
  lo: number;
  parent: number;
  leaf: boolean;
}

/** A helper's result: the positions of its pieces in perm, its nodes (parents encoded as in PieceMessage). */
export interface HelperResult {
  perm: Int32Array;
  first: Int32Array;
  sepFirst: Int32Array;
  end: Int32Array;
  parent: Int32Array;
  placed: number;
  /** Set instead of the rest when the helper failed. */
  error?: string;
}

/** Takes `count` helpers (fewer, or none, where threads or the helper script are not available). */
export function startTeam(count: number, script: URL | undefined): Member[] {
  if (count < 1) return [];
  const url = script ?? defaultHelperScript();
  if (url === null) return [];
  const team: Member[] = [];
  for (let i = 0; i < count; i++) {
    const helper = takeHelper(url);
    if (helper === null) break;
    team.push({ helper, pieces: [], working: false });
  }
  return team;
}

/** Gives the helpers back: idle ones to the pool, those still working (after an error or an abort) are stopped. */
export function stopTeam(team: Member[]): void {
  for (const m of team) releaseHelper(m.helper, m.working);
}

/** Vertices placed so far by the helpers whose results are not merged yet. */
export function teamPlaced(team: Member[]): number {
  let placed = 0;
  for (const m of team) if (m.working) placed += helperPlaced(m.helper);
  return placed;
}

/** A group is balanced when it is at most this much heavier than an equal share. */
const BALANCE = 1.1;

/**
 * Cuts the heaviest open pieces here until the open pieces form team.length + 1
 * balanced groups (at most 4 cuts per thread), keeps the lightest group on the
 * stack (none with `keepNone`, for tests: this thread then only takes pieces
 * back) and sends each other group to a helper. Returns the members that got
 * pieces (the others go back to the pool).
 */
export function shareOut(s: State, team: Member[], tick: () => void, keepNone = false): Member[] {
  let open = openPieces(s);
  let groups = group(open, team.length + 1);
  for (let cuts = 0; cuts < 4 * (team.length + 1) && !groups.balanced; cuts++) {
    if (open.length === 0 || team.length === 0) break;
    tick();
    s.stack.splice(s.stack.indexOf(open[0]), 1);
    const failed = { helper: false };
    processPiece(s, open[0], secondStartOn(s, team[0], open[0], tick, failed));
    if (failed.helper) team = team.slice(1);
    open = openPieces(s);
    groups = group(open, team.length + 1);
  }
  const parts = team.length + 1;
  if (keepNone && parts > 1) groups.bins[1].push(...groups.bins[0].splice(0));
  const init: HelperInit = { offsets: s.top.offsets, neighbours: s.top.neighbours, hairRoot: s.hairRoot, settings: s.set };
  const busy: Member[] = [];
  for (let i = 1; i < parts; i++) {
    const m = team[i - 1];
    if (groups.bins[i].length === 0) { releaseHelper(m.helper, false); continue; }
    m.pieces = groups.bins[i];
    for (const p of m.pieces) s.stack.splice(s.stack.indexOf(p), 1);
    sendJob(m.helper, { init, pieces: m.pieces.map((p) => toMessage(p, p.parent < 0 ? -1 : -2 - p.parent)) });
    m.working = true;
    busy.push(m);
  }
  return busy;
}

/** Pieces on the stack that will be cut (not leaves), heaviest first. */
function openPieces(s: State): Pending[] {
  return s.stack.filter((p) => p.graph !== null && !p.leaf && p.ids.length > s.set.leafSize).sort((a, b) => cost(b) - cost(a));
}

/** Work of a piece, in proportion: its vertices and adjacency entries. */
function cost(p: Pending): number {
  return p.graph === null ? p.ids.length : p.graph.n + p.graph.neighbours.length;
}

/** Largest-first assignment of the pieces (heaviest first) to `parts` groups; groups in order of weight, lightest first. */
function group(open: Pending[], parts: number): { bins: Pending[][]; balanced: boolean } {
  const bins: { load: number; pieces: Pending[] }[] = Array.from({ length: parts }, () => ({ load: 0, pieces: [] }));
  let total = 0;
  for (const p of open) {
    let lightest = bins[0];
    for (const b of bins) if (b.load < lightest.load) lightest = b;
    lightest.pieces.push(p);
    lightest.load += cost(p);
    total += cost(p);
  }
  bins.sort((a, b) => a.load - b.load);
  const balanced = open.length >= parts && bins[parts - 1].load <= (BALANCE * total) / parts;
  return { bins: bins.map((b) => b.pieces), balanced };
}

/** An array that owns its buffer: a view is copied (a message would copy the whole buffer behind it). */
function own(a: Int32Array): Int32Array {
  return a.byteOffset === 0 && a.byteLength === a.buffer.byteLength ? a : a.slice();
}

/**
 * A piece as a message. `parent` as the receiver reads it: from the calling
 * thread, its node j is sent as -2 - j; from a helper, parents go as they are
 * (its own nodes ≥ 0, the caller's already written -2 - j).
 */
function toMessage(p: Pending, parent: number): PieceMessage {
  return { ...graphMessage(p.graph!), ids: own(p.ids), lo: p.lo, parent, leaf: p.leaf };
}

/** A graph as (part of) a message. */
function graphMessage(g: WGraph): GraphMessage {
  return {
    n: g.n, offsets: own(g.offsets), neighbours: own(g.neighbours), edgeWeight: g.unitEdges ? null : own(g.edgeWeight),
    vertexWeight: own(g.vertexWeight), totalWeight: g.totalWeight, maxVertexWeight: g.maxVertexWeight,
  };
}

/** The job of refining one piece's second start: the graph to cut and the key of the piece's random stream. */
export interface StartJob {
  kind: "start";
  settings: Settings;
  graph: GraphMessage;
  lo: number;
  n: number;
}

/**
 * While this thread cuts `piece`, the helper refines the cut's second start
 * (see multilevelSeparator); a helper that fails is stopped and `failed.helper` set.
 */
function secondStartOn(s: State, m: Member, piece: Pending, tick: () => void, failed: { helper: boolean }): SecondStartElsewhere {
  return (g) => {
    // the coordinates play no part in a multilevel start: not copied to the helper
    const job: StartJob = { kind: "start", settings: { ...s.set, coordinates: undefined }, graph: graphMessage(g), lo: piece.lo, n: piece.graph!.n };
    sendJob(m.helper, job);
    m.working = true; // until the result is in: a helper left working (an abort meanwhile) is stopped, not pooled
    return () => {
      const r = awaitEvent(m.helper, tick) === "done" ? takeMessage<{ label: Int8Array | null; error?: string }>(m.helper) : null;
      m.working = false;
      if (r !== null && r.error === undefined) return r.label;
      releaseHelper(m.helper, true);
      failed.helper = true;
      return undefined;
    };
  };
}

/** The helper's side of {@link secondStartOn}. */
export function secondStart(job: StartJob): { label: Int8Array | null } {
  const space = takeWork(job.graph.n, job.graph.neighbours.length);
  const g = fromMessage(job.graph, space.ones);
  const label = secondStartOnly(g, pieceRng(job.settings.seed, job.lo, job.n), job.settings.bisect, space.work);
  keepWork(space);
  return { label };
}

/**
 * Waits for each helper (the one with the most work left first) and merges
 * its result; while waiting, this thread
 * asks the helper for pieces and cuts them itself (the helper gives away its
 * heaviest open piece between two of its own), so neither thread idles while
 * the other has work. A helper that fails (or does not start) has its pieces
 * cut here, and what this thread did for it is dropped. Returns the number of
 * threads that did work, this one included, and the pieces taken back.
 */
export function joinTeam(s: State, team: Member[], tick: () => void): { threads: number; takenBack: number } {
  let threads = 1;
  let takenBack = 0;
  const waiting = team.slice();
  while (waiting.length > 0) {
    const m = mostLeft(waiting);
    const mark = { nodes: s.first.length, placed: s.placed };
    const r = helpWhileWaiting(s, m, tick);
    m.working = false;
    if (r === null) {
      releaseHelper(m.helper, true);
      truncateNodes(s, mark.nodes);
      s.placed = mark.placed;
      s.stack.push(...m.pieces);
      drain(s, tick);
      continue;
    }
    merge(s, m.pieces, r.result, r.taken, mark.nodes);
    threads++;
    takenBack += r.taken.length;
  }
  return { threads, takenBack };
}

/**
 * Takes from the list the helper with the most vertices still to place: the
 * one whose pieces are most worth taking over (with more than one helper, the
 * others may finish meanwhile; their results wait until this one is merged).
 */
function mostLeft(waiting: Member[]): Member {
  let best = 0;
  let most = -Infinity;
  for (let i = 0; i < waiting.length; i++) {
    let left = -helperPlaced(waiting[i].helper);
    for (const p of waiting[i].pieces) left += p.ids.length;
    if (left > most) { most = left; best = i; }
  }
  return waiting.splice(best, 1)[0];
}

/** Positions this thread filled for a helper: ranges of the pieces it took over. */
type Taken = { lo: number; values: Int32Array }[];

/** Cuts pieces taken from the helper until it has none to give, then waits for its result (null: it failed). */
function helpWhileWaiting(s: State, m: Member, tick: () => void): { result: HelperResult; taken: Taken } | null {
  const taken: Taken = [];
  askForPiece(m.helper);
  for (;;) {
    const event = awaitEvent(m.helper, tick);
    if (event === "none") continue;
    if (event === "failed") return null;
    if (event === "done") {
      const result = takeMessage<HelperResult>(m.helper);
      return result === null || result.error !== undefined ? null : { result, taken };
    }
    const message = takeMessage<{ piece: PieceMessage }>(m.helper);
    if (message === null) return null;
    const p = message.piece;
    // a parent among the helper's nodes (p.parent ≥ 0) is written -2 - index here and linked when
    // the helper's nodes are merged; a parent here (p.parent ≤ -2) is node -2 - p.parent
    const parent = p.parent === -1 ? -1 : -2 - p.parent;
    s.stack.push({ graph: fromMessage(p, s.ones), ids: p.ids, lo: p.lo, parent, leaf: p.leaf });
    drain(s, tick);
    taken.push({ lo: p.lo, values: s.perm.slice(p.lo, p.lo + p.ids.length) });
    askForPiece(m.helper);
  }
}

function truncateNodes(s: State, count: number): void {
  s.first.length = count; s.sepFirst.length = count; s.end.length = count; s.parent.length = count;
}

/**
 * Copies the helper's positions for its pieces (those this thread took over
 * keep what it wrote) and appends its nodes; nodes made here since `from`
 * whose parent is a helper node (-2 - index) are linked to it.
 */
function merge(s: State, pieces: Pending[], r: HelperResult, taken: Taken, from: number): void {
  for (const p of pieces) s.perm.set(r.perm.subarray(p.lo, p.lo + p.ids.length), p.lo);
  for (const t of taken) s.perm.set(t.values, t.lo);
  const offset = s.first.length;
  for (let i = from; i < offset; i++) if (s.parent[i] <= -2) s.parent[i] = offset + (-2 - s.parent[i]);
  for (let i = 0; i < r.first.length; i++) {
    const q = r.parent[i];
    addNode(s, r.first[i], r.sepFirst[i], r.end[i], q >= 0 ? q + offset : q === -1 ? -1 : -2 - q);
  }
  s.placed += r.placed;
}

/**
 * The helper's side: dissects the pieces it was sent, with workspaces sized
 * for the largest, and reports progress and signs of life through `control`.
 */
export function dissectPieces(
  init: HelperInit, pieces: PieceMessage[], control: Int32Array, orderLeaf: LeafOrdering, give: (message: { piece: PieceMessage }) => void,
): HelperResult {
  const top: Graph = { n: init.offsets.length - 1, offsets: init.offsets, neighbours: init.neighbours };
  let most = 1;
  let edges = 1;
  for (const p of pieces) { most = Math.max(most, p.n); edges = Math.max(edges, p.neighbours.length); }
  const space = takeWork(most, edges);
  const s = newState(top, init.settings, orderLeaf, space.work, space.ones, init.hairRoot);
  for (const p of pieces) s.stack.push({ graph: fromMessage(p, space.ones), ids: p.ids, lo: p.lo, parent: p.parent, leaf: p.leaf });
  drain(s, () => {
    if (Atomics.load(control, Slot.Abort) === 1) throw new AbortedError("nested dissection helper stopped");
    Atomics.store(control, Slot.Placed, s.placed);
    Atomics.add(control, Slot.Beat, 1);
    if (Atomics.load(control, Slot.Want) === 1 && Atomics.load(control, Slot.Given) === 0) offer(s, control, give);
  });
  keepWork(space);
  return {
    perm: s.perm, first: Int32Array.from(s.first), sepFirst: Int32Array.from(s.sepFirst), end: Int32Array.from(s.end),
    parent: Int32Array.from(s.parent), placed: s.placed,
  };
}

/**
 * The helper's workspace, kept between its jobs (allocating and first touching
 * it costs tens of milliseconds on 10⁶-vertex pieces) until the helper has
 * been idle for KEEP_MS. A job that fails does not give it back: it may have
 * been left in the middle of a use.
 */
let kept: Workspace | null = null;

/** A workspace, edge weights all ones for unit-weight pieces, and the largest piece they were made for. */
interface Workspace { work: FmWork; ones: Int32Array; most: number; edges: number }

/** A workspace for pieces of up to `most` vertices and `edges` list entries. */
function takeWork(most: number, edges: number): Workspace {
  const k = kept;
  kept = null;
  if (k !== null && k.most >= most && k.edges >= edges) return k;
  return { work: fmWork(most, edges), ones: new Int32Array(edges).fill(1), most, edges };
}

/** An idle helper lets its workspace go after this long (the next job allocates a new one). */
const KEEP_MS = 10_000;
let release: ReturnType<typeof setTimeout> | undefined;

function keepWork(w: Workspace): void {
  kept = w;
  clearTimeout(release);
  release = setTimeout(() => { kept = null; }, KEEP_MS);
}

/** Pieces smaller than this many leaves are not worth handing over. */
const SMALLEST_GIFT = 4;

/**
 * Answers the caller's request: gives away the heaviest open piece that holds
 * at most half of the open work (so that neither thread ends up waiting long
 * for the other), says there is none when no open piece is worth handing
 * over, or leaves the request for a later piece when one piece holds more
 * than half (it is cut next, and one of its parts goes).
 */
function offer(s: State, control: Int32Array, give: (message: { piece: PieceMessage }) => void): void {
  const open = openPieces(s);
  const smallest = SMALLEST_GIFT * s.set.leafSize;
  let p: Pending | null = null;
  if (open.length > 0 && open[0].ids.length >= smallest) {
    let total = 0;
    for (const q of open) total += cost(q);
    const fits = open.find((q) => 2 * cost(q) <= total);
    if (fits === undefined || fits.ids.length < smallest) return;
    p = fits;
    s.stack.splice(s.stack.indexOf(p), 1);
    give({ piece: toMessage(p, p.parent) });
  }
  Atomics.store(control, Slot.Want, 0);
  Atomics.store(control, Slot.Given, p === null ? 2 : 1);
  signal(control);
}

function fromMessage(p: GraphMessage, ones: Int32Array): WGraph {
  return {
    n: p.n, offsets: p.offsets, neighbours: p.neighbours, edgeWeight: p.edgeWeight ?? ones.subarray(0, p.neighbours.length),
    vertexWeight: p.vertexWeight, totalWeight: p.totalWeight, maxVertexWeight: p.maxVertexWeight, unitEdges: p.edgeWeight === null,
  };
}
