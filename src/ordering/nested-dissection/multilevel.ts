/**
 * One multilevel vertex bisection (Hendrickson & Leland 1995; Karypis & Kumar
 * 1998, SIAM J. Sci. Comput. 20(1)): coarsen by heavy-edge matching, bisect the
 * coarsest graph by greedy growing from several seeds, project back level by
 * level with FM refinement, then turn the edge cut into a vertex separator.
 * Large pieces also refine a second start grown to about a third of the weight
 * and keep the lighter separator: on 2-D meshes a lighter cut off a corner
 * often beats the balanced cut through the middle that the first start finds.
 */
import { initialBisection } from "./bisect.js";
import { coarsen, type Level } from "./coarsen.js";
import { evaluate, projectBisection, refineBisection, type Bisection, type FmWork } from "./refine.js";
import type { Rng } from "./rng.js";
import { vertexSeparatorFromCut } from "./separator.js";
import { refineSeparator, separatorState, type SeparatorState } from "./separator-refine.js";
import type { WGraph } from "./wgraph.js";

/** Tuning of one bisection. */
export interface BisectOptions {
  /** Stop coarsening at this many vertices. */
  coarsestSize: number;
  /** Greedy-growing tries on the coarsest graph. */
  tries: number;
  /** Allowed excess of the heavier part over half the weight (0.6 = 60 %: measured best for fill on grids, bench/ordering.mjs). */
  imbalance: number;
  /** Allowed excess for the vertex-separator refinement (looser: a lighter separator is worth some imbalance). */
  separatorImbalance: number;
  /** FM passes per level. */
  passes: number;
  /**
   * Where the vertex separator is formed and refined: "finest" = edge FM on
   * every level, cover and separator FM on the finest; "all" = cover on the
   * coarsest graph, separator FM on every level; "none" = cover only;
   * "both" = "all" and "finest" on pieces of at least `bothAbove` vertices,
   * keeping the lighter separator ("all" on smaller pieces).
   */
  separatorRefinement: "finest" | "all" | "none" | "both";
  bothAbove: number;
  /**
   * Growth target of the second coarsest start, as a fraction of the weight (0: no
   * second start). It is refined like the first and the lighter separator is kept.
   */
  secondStart: number;
  /** Pieces that get a second start: at least this share of the whole graph's weight… */
  secondStartShare: number;
  /** …and at least this many vertices. */
  secondStartAbove: number;
}

/**
 * Defaults. The second start (0.35 of the weight, pieces of ≥ 1/20 of the graph and ≥ 5,000
 * vertices, so about the top five levels of the dissection) was measured over seeds 1–8
 * (flops ND ÷ MD, gmean): 2-D 300² 0.621 → 0.536, plate mesh 0.743 → 0.668, random
 * geometric 1.157 → 1.118, 3-D 40³, 9-point 255² and elasticity3d(30) within ±2 %;
 * 1000² over seeds 1–3 0.585 → 0.553, for about 20–25 % more time. Growing to 0.3 or 0.4
 * did worse; a second start on every piece cost elasticity 16³ +6 %, and refining the
 * second start by the separator path alone did worse on elasticity.
 */
export const defaultBisectOptions: BisectOptions = {
  coarsestSize: 100, tries: 6, imbalance: 0.6, separatorImbalance: 0.6, passes: 8, separatorRefinement: "both", bothAbove: 1000,
  secondStart: 0.35, secondStartShare: 0.05, secondStartAbove: 5000,
};

/** Largest admissible part weight for graph g. */
function partBound(g: WGraph, imbalance: number): number {
  return Math.max(Math.ceil((g.totalWeight * (1 + imbalance)) / 2), Math.ceil((g.totalWeight + g.maxVertexWeight) / 2));
}

/** Greedy-growing tries: all of them on large pieces, fewer on the many small ones. */
function triesFor(g: WGraph, o: BisectOptions): number {
  return g.n >= 20000 ? o.tries : g.n >= 2000 ? Math.min(o.tries, 3) : Math.min(o.tries, 2);
}

/** The coarsest graph of the hierarchy (g itself when there is none). */
function coarsestOf(g: WGraph, levels: Level[]): WGraph {
  return levels.length > 0 ? levels[levels.length - 1].graph : g;
}

/** Edge bisection of the coarsest graph, each try grown to `fraction` of the weight. */
function coarsestBisection(g: WGraph, levels: Level[], rng: Rng, o: BisectOptions, work: FmWork, fraction: number): Bisection {
  const coarsest = coarsestOf(g, levels);
  return initialBisection(coarsest, rng, triesFor(g, o), partBound(coarsest, o.imbalance), work, fraction);
}

/** The labelling of `fine` that gives each vertex the label of its coarse vertex in `level`. */
function project(fine: WGraph, level: Level, coarseLabel: Int8Array): Int8Array {
  const { coarseOf } = level;
  const label = new Int8Array(fine.n);
  for (let v = 0; v < fine.n; v++) label[v] = coarseLabel[coarseOf[v]];
  return label;
}

/** Projects an edge bisection of the coarsest graph back to g with FM refinement at every level. */
function uncoarsenBisection(g: WGraph, levels: Level[], start: Bisection, o: BisectOptions, work: FmWork): Bisection {
  let b = start;
  for (let i = levels.length - 1; i >= 0; i--) {
    const fine = i > 0 ? levels[i - 1].graph : g;
    b = projectBisection(fine, levels[i].coarseOf, i > 0 ? levels[i - 1].degree : null, b, work);
    refineBisection(fine, b, partBound(fine, o.imbalance), o.passes, work);
  }
  return b;
}

/** Refines a given 2-way labelling of g (for example a coordinate cut) with FM at one level. */
export function refineGiven(g: WGraph, label: Int8Array, o: BisectOptions, work: FmWork): Bisection {
  const b = evaluate(g, label, work);
  refineBisection(g, b, partBound(g, o.imbalance), o.passes, work);
  return b;
}

/**
 * Vertex separator of g from a 2-way labelling, in place: labels 0 / 1 for the
 * parts, 2 for the separator. Given a Bisection, it must be the one last
 * evaluated or refined with `work`: the work's boundary list is its boundary,
 * and its part weights give the separator state's without a scan.
 */
export function separate(g: WGraph, from: Int8Array | Bisection, o: BisectOptions, work: FmWork): Int8Array {
  return separateState(g, from, o, work).label;
}

function separateState(g: WGraph, from: Int8Array | Bisection, o: BisectOptions, work: FmWork): SeparatorState {
  const evaluated = !(from instanceof Int8Array);
  const label = evaluated ? from.label : from;
  const taken = vertexSeparatorFromCut(g, label, work.cover, evaluated ? { list: work.boundary, count: work.boundaryCount } : undefined);
  const st: SeparatorState = evaluated
    ? { label, weight: [from.weight[0] - taken[0], from.weight[1] - taken[1], taken[0] + taken[1]] }
    : separatorState(g, label);
  if (o.separatorRefinement !== "none") refineSeparator(g, st, partBound(g, o.separatorImbalance), o.passes, work);
  return st;
}

/**
 * Multilevel vertex separator of g (labels 0 / 1 / 2); `wholeWeight` is the
 * weight of the whole graph being dissected, which decides whether g is large
 * enough for a second start.
 */
export function multilevelSeparator(g: WGraph, rng: Rng, o: BisectOptions, work: FmWork, wholeWeight = g.totalWeight, elsewhere?: SecondStartElsewhere): Int8Array {
  const second = hasSecondStart(g, o, wholeWeight);
  const collect = second && elsewhere !== undefined ? elsewhere(g) : null;
  const { levels, start, other, same } = coarseStarts(g, rng, o, work, second);
  if (other === null) return refineStart(g, levels, start, o, work);
  // each start is evaluated again just before its refinement: the cover step reads the work's boundary list
  const coarsest = coarsestOf(g, levels);
  const a = refineStart(g, levels, evaluate(coarsest, start.label, work), o, work);
  const remote = collect === null ? undefined : collect();
  if (same) return a;
  return lighter(g, a, remote ?? refineStart(g, levels, evaluate(coarsest, other.label, work), o, work));
}

/**
 * The hierarchy of g and its coarsest start (and, with `second`, the second
 * start, null otherwise), drawn from rng in one fixed order: another thread
 * refining the second start ({@link secondStartOnly}) must draw exactly alike.
 * About a third of the second starts end, after FM on the coarsest graph, as
 * the very same bisection (`same`); the refinement draws no random numbers,
 * so it would repeat the first result.
 */
function coarseStarts(g: WGraph, rng: Rng, o: BisectOptions, work: FmWork, second: boolean): { levels: Level[]; start: Bisection; other: Bisection | null; same: boolean } {
  const levels = coarsen(g, rng, o.coarsestSize, work.arenas);
  const start = coarsestBisection(g, levels, rng, o, work, 0.5);
  if (!second) return { levels, start, other: null, same: false };
  const other = coarsestBisection(g, levels, rng, o, work, o.secondStart);
  return { levels, start, other, same: sameLabels(start.label, other.label) };
}

/**
 * Hands the refinement of g's second start to another thread, which repeats
 * the coarsening and both coarsest bisections from the same random stream;
 * returns a function that waits for the refined labels (null when that thread
 * found the two starts the same, undefined when it failed: refined here then).
 */
export type SecondStartElsewhere = (g: WGraph) => () => Int8Array | null | undefined;

/** Whether g is large enough (in itself and against the whole graph) for a second start. */
export function hasSecondStart(g: WGraph, o: BisectOptions, wholeWeight: number): boolean {
  return o.secondStart > 0 && g.n >= o.secondStartAbove && g.totalWeight >= o.secondStartShare * wholeWeight;
}

/**
 * The other thread's part of {@link SecondStartElsewhere}: g's second start
 * refined, as multilevelSeparator refines it with the same `rng` (fresh for
 * the piece); null when it is the same as the first start.
 */
export function secondStartOnly(g: WGraph, rng: Rng, o: BisectOptions, work: FmWork): Int8Array | null {
  const { levels, other, same } = coarseStarts(g, rng, o, work, true);
  if (same || other === null) return null;
  return refineStart(g, levels, evaluate(coarsestOf(g, levels), other.label, work), o, work);
}

function sameLabels(a: Int8Array, b: Int8Array): boolean {
  for (let v = 0; v < a.length; v++) if (a[v] !== b[v]) return false;
  return true;
}

/**
 * Separator from a coarsest bisection that is the one last evaluated with
 * `work`. "both" shares the hierarchy and the start between its two
 * refinement paths and keeps the lighter result.
 */
function refineStart(g: WGraph, levels: Level[], start: Bisection, o: BisectOptions, work: FmWork): Int8Array {
  if (o.separatorRefinement === "finest" || o.separatorRefinement === "none") {
    return separate(g, uncoarsenBisection(g, levels, start, o, work), o, work);
  }
  if (o.separatorRefinement === "all" || g.n < o.bothAbove) return separatorByLevels(g, levels, start, o, work).label;
  const copy: Bisection = { label: start.label.slice(), weight: [start.weight[0], start.weight[1]], cut: start.cut };
  // the separator refinement leaves the work's boundary list, degrees and marks as it found
  // them, so the copy is still "the bisection last refined with work" for projectBisection
  const a = separatorByLevels(g, levels, start, o, work);
  return lighterState(a, separateState(g, uncoarsenBisection(g, levels, copy, o, work), o, work)).label;
}

/** The labelling with the lighter separator; ties go to the better balance. */
export function lighter(g: WGraph, a: Int8Array, b: Int8Array): Int8Array {
  return lighterState(separatorState(g, a), separatorState(g, b)).label;
}

function lighterState(a: SeparatorState, b: SeparatorState): SeparatorState {
  const wa = a.weight;
  const wb = b.weight;
  if (wa[2] !== wb[2]) return wa[2] < wb[2] ? a : b;
  return Math.abs(wa[0] - wa[1]) <= Math.abs(wb[0] - wb[1]) ? a : b;
}

/**
 * Cover on the coarsest graph, then separator FM on every level while
 * projecting back. A projection keeps the three weights (a coarse vertex
 * weighs what its fine vertices weigh together), so the state is carried
 * over instead of recomputed by a scan of each level.
 */
function separatorByLevels(g: WGraph, levels: Level[], start: Bisection, o: BisectOptions, work: FmWork): SeparatorState {
  const st = separateState(coarsestOf(g, levels), start, o, work);
  for (let i = levels.length - 1; i >= 0; i--) {
    const fine = i > 0 ? levels[i - 1].graph : g;
    st.label = project(fine, levels[i], st.label);
    refineSeparator(fine, st, partBound(fine, o.separatorImbalance), o.passes, work);
  }
  return st;
}
