/**
 * The Factorization object: runs the multifrontal pass (multifrontal.ts) on a
 * store reserved once from the predicted workspace, maps pivot failures back
 * to the caller's numbering, and offers solves (with iterative refinement and
 * the Rigal–Gaches normwise backward error), refactor, log-determinant and
 * inertia. Any failure leaves it refusing to solve until a refactor succeeds.
 */
import {
  AbortedError, CapacityError, InputError, NotPositiveDefiniteError, optionsObject, PatternMismatchError, SeptumError,
} from "../errors.js";
import { jsKernels } from "../kernels/js/index.js";
import type { DenseKernels } from "../kernels/types.js";
import { SparseMatrix } from "../matrix/sparse.js";
import { requireSquare, requireSymmetric } from "../matrix/symmetric.js";
import { multifrontal, type PivotFailure } from "./multifrontal.js";
import { buildScatterMap, rowStatistics, samePattern, type ScatterMap } from "./scatter.js";
import { ldltGrowth } from "./growth.js";
import { refineSolve } from "./refine.js";
import { backwardSweep, diagonalSweep, forwardSweep, largestBelow } from "./triangular.js";
import {
  DEFAULT_PIVOT_TOLERANCE, type FactorMethod, type FactorOptions, type FactorStats, type Inertia,
  type NumericInput, type SolveInfo, type SolveOptions,
} from "./types.js";
import { stackSchedule, workspaceOf, type StackSchedule, type WorkspacePrediction } from "./workspace.js";

/**
 * Growth ρ above which solves refine by default: the backward error of the
 * plain sweeps may then reach n·ε·ρ (growth.ts), far from Cholesky's.
 */
export const AUTO_REFINE_GROWTH = 16;

/** Options that may change from one refactor to the next. */
export interface RefactorOptions {
  /** Called with the fraction (0..1] of the factorization flops done, between supernodes. */
  onProgress?: (fraction: number) => void;
  /** Checked between supernodes; when aborted the factorization throws AbortedError and is left unusable. */
  signal?: AbortSignal;
}

/**
 * Numeric factorization of P·A·Pᵀ = L·Lᵀ (Cholesky) or L·D·Lᵀ for the
 * structure of an analysis. Create it with `analysis.factor`.
 */
export class Factorization {
  /** "cholesky" or "ldlt". */
  readonly method: FactorMethod;
  /** Order of the matrix. */
  readonly n: number;
  private readonly input: NumericInput;
  private readonly kernels: DenseKernels;
  private readonly pivotTolerance: number;
  private readonly schedule: StackSchedule;
  private readonly workspace: WorkspacePrediction;
  private readonly cumulativeFlops: Float64Array;
  private readonly solveTmp: Float64Array;
  /** Index workspaces of the multifrontal pass: every entry is written before it is read, so one set serves every refactor. */
  private readonly frontWork: { cbOffset: Float64Array; local: Int32Array; rel: Int32Array; runEnd: Int32Array };
  private map: ScatterMap | null = null;
  private matrix: SparseMatrix | null = null;
  private normInf = 0;
  private failure: string | null = "not factored yet";
  /** ρ of the last factorization (growth.ts): 1 for Cholesky. */
  private growth = 1;
  /** |a_jj| of each column j of A in the new numbering (statistics), the scale of pivot j (multifrontal.ts). */
  private readonly diag: Float64Array;
  /** L·D·Lᵀ: Σ_k l_jk²·|d_k| of each column j (new numbering), summed by the pass; with diag, the scale of pivot j. */
  private readonly terms: Float64Array;
  /** Largest |a_ij| of A (statistics), the denominator of the growth. */
  private maxA = 0;
  /** n doubles: row sums of |A| (rowStatistics). */
  private readonly rowSums: Float64Array;
  /** n doubles: 1 / (diagonal j of the factor), L_jj or d_j (new numbering), for the solves. */
  private readonly recip: Float64Array;
  private lastStats: FactorStats | null = null;
  /**
   * Smallest relative pivot min_j |p_j| / r_j over the diagonal of the
   * factor, with p_j = L_jj² (Cholesky) or d_j (L·D·Lᵀ) and r_j = |a_jj|, or
   * for L·D·Lᵀ where a_jj = 0 the terms d_j was formed from, Σ_k l_jk²·|d_k|
   * (new numbering), folded in by the pass after each supernode
   * (multifrontal.ts, where the rule is argued). A pivot is the diagonal of a Schur
   * complement; a ratio near ε means it cancelled to rounding: A is singular
   * or nearly so to working precision. Ratio 1 for n = 0; position
   * is the new-numbering column of the first pivot reaching it (-1 for n = 0).
   */
  private readonly smallest = { ratio: Infinity, position: -1 };

  /** @internal Use `factorize`. */
  constructor(input: NumericInput, options: FactorOptions = {}) {
    const method = options.method ?? "cholesky";
    if (method !== "cholesky" && method !== "ldlt") throw new InputError(`unknown method "${String(method)}", expected "cholesky" or "ldlt"`);
    const tol = options.pivotTolerance ?? DEFAULT_PIVOT_TOLERANCE;
    if (!(tol >= 0) || !Number.isFinite(tol)) throw new InputError(`pivotTolerance must be a finite number >= 0, got ${tol}`);
    this.method = method;
    this.input = input;
    this.n = input.structure.n;
    this.kernels = options.kernels ?? jsKernels();
    this.pivotTolerance = tol;
    this.schedule = stackSchedule(input.structure);
    this.workspace = workspaceOf(input.structure, method, this.schedule);
    this.cumulativeFlops = flopsAlongOrder(input, this.schedule.order);
    this.solveTmp = new Float64Array(largestBelow(input.structure));
    const st = input.structure;
    this.diag = new Float64Array(st.n);
    this.terms = new Float64Array(method === "ldlt" ? st.n : 0);
    this.rowSums = new Float64Array(st.n);
    this.recip = new Float64Array(st.n);
    this.frontWork = {
      cbOffset: new Float64Array(st.supernodeCount), local: new Int32Array(st.n), rel: new Int32Array(st.n), runEnd: new Int32Array(st.n),
    };
  }

  /** Figures of the last successful factorization. */
  get stats(): FactorStats {
    return this.usable().lastStats as FactorStats;
  }

  /**
   * Factor new values with the same pattern (no symbolic work). A different
   * pattern throws PatternMismatchError. On any error the factorization is
   * left unusable until a later refactor succeeds.
   */
  refactor(A: SparseMatrix, given: RefactorOptions = {}): this {
    const options = optionsObject(given, "refactor");
    this.failure = "the last factorization did not complete";
    const t0 = performance.now();
    try {
      this.load(A);
      this.statistics(A);
      this.run(options, A.values);
      this.growth = this.method === "ldlt" ? ldltGrowth(this.input.structure, this.kernels.view(), this.terms, this.maxA) : 1;
    } catch (e) {
      this.failure = e instanceof Error ? `the last factorization failed: ${e.message}` : "the last factorization failed";
      throw e;
    }
    const seconds = (performance.now() - t0) / 1000;
    const flops = this.cumulativeFlops[this.cumulativeFlops.length - 1] || 0;
    // Refinement needs the matrix that was factored, even if the caller later changes A's values.
    const map = this.map as ScatterMap;
    this.matrix = SparseMatrix.trusted(this.n, this.n, map.colPtr, map.rowIdx, A.values.slice(0, map.colPtr[this.n]));
    const low = this.smallest;
    this.lastStats = {
      method: this.method, kernels: this.kernels.name, seconds, flops,
      gflopsPerSecond: seconds > 0 ? flops / seconds / 1e9 : 0,
      factorBytes: 8 * this.workspace.factorDoubles, peakBytes: this.workspace.peakBytes,
      supernodes: this.input.structure.supernodeCount, growth: this.growth,
      smallestPivot: low.ratio === Infinity ? 1 : low.ratio, smallestPivotColumn: low.position < 0 ? -1 : this.input.permutation[low.position],
    };
    this.failure = null;
    return this;
  }

  /** Check A, build or verify the scatter map and reserve the store (the pass assembles A supernode by supernode). */
  private load(A: SparseMatrix): void {
    requireSquare(A);
    if (A.ncols !== this.n) throw new PatternMismatchError(`matrix has order ${A.ncols}, the analysis was made for order ${this.n}`);
    if (this.map === null) this.map = buildScatterMap(this.input.structure, this.input.inversePermutation, A);
    else if (!samePattern(this.map, A)) {
      throw new PatternMismatchError("matrix pattern differs from the one this factorization was made for");
    }
    if (this.map.form === "full") requireSymmetric(A);
    const w = this.workspace;
    this.kernels.reserve(w.factorDoubles + w.stackDoubles + w.scratchDoubles);
  }

  /** The multifrontal pass with progress and abort between supernodes. */
  private run(options: RefactorOptions, values: Float64Array): void {
    const { signal, onProgress } = options;
    if (signal?.aborted) throw new AbortedError("factorization aborted before it started");
    const smallest = this.smallest;
    smallest.ratio = Infinity;
    smallest.position = -1;
    this.terms.fill(0);
    const st = this.input.structure, w = this.workspace, cum = this.cumulativeFlops;
    const total = cum[cum.length - 1] || 1;
    let step = 0, reported = 0;
    const between = (): void => {
      const done = cum[step++];
      if (signal?.aborted) throw new AbortedError(`factorization aborted after ${step} of ${st.supernodeCount} supernodes`);
      if (onProgress && (done - reported >= 0.01 * total || step === st.supernodeCount)) {
        reported = done;
        onProgress(done / total);
      }
    };
    const fail = multifrontal({
      st, kernels: this.kernels, method: this.method, order: this.schedule.order, map: this.map as ScatterMap, values,
      childPtr: this.schedule.childPtr, children: this.schedule.children,
      stackBase: w.factorDoubles, scratch: w.factorDoubles + w.stackDoubles,
      pivotTolerance: this.pivotTolerance, // L·D·Lᵀ only: Cholesky stops on pivots <= 0
      ...this.frontWork,
      diag: this.diag, terms: this.terms, smallest, recip: this.recip,
      between,
    });
    if (fail) throw this.pivotError(fail);
  }

  /**
   * One pass over A's values (rowStatistics): rejects non-finite entries,
   * sets ‖A‖∞, the largest |a_ij| and |a_jj| of each column j in the new
   * numbering.
   */
  private statistics(A: SparseMatrix): void {
    const r = rowStatistics(this.map as ScatterMap, A.values, this.input.inversePermutation, this.rowSums, this.diag);
    this.normInf = r.normInf;
    this.maxA = r.largest;
  }

  private pivotError(f: PivotFailure): NotPositiveDefiniteError {
    const st = this.input.structure;
    const column = this.input.permutation[st.superStart[f.supernode] + f.column];
    const what = this.method === "cholesky"
      ? `matrix is not positive definite: pivot ${f.pivot} <= 0`
      : `L·D·Lᵀ met a zero or tiny pivot ${f.pivot} (|d_j| <= ${this.pivotTolerance} · |a_jj|, or where a_jj = 0 · Σ_k l_jk²·|d_k|, the terms d_j was formed from)`;
    return new NotPositiveDefiniteError(column, f.pivot, `${what} at column ${column} (0-based, original numbering)`);
  }

  /** Throw unless the last factorization succeeded. */
  private usable(): this {
    if (this.failure !== null) throw new SeptumError(`factorization is not usable: ${this.failure}; call refactor with a valid matrix`);
    return this;
  }

  /**
   * Solve A·x = b; b of length n or n×k column-major. Returns a new array.
   * Without `refine`, an L·D·Lᵀ factorization whose growth exceeds
   * AUTO_REFINE_GROWTH refines (as `refine: true`); Cholesky never needs to.
   */
  solve(b: Float64Array | number[], given: SolveOptions = {}): Float64Array {
    const options = optionsObject(given, "solve");
    this.usable();
    if (this.refineSteps(options)) return this.solveWithInfo(b, options).x;
    return this.solveInPlace(rhsCopy(b)); // solveInPlace checks the right-hand side
  }

  /**
   * `options.refine` after checking it (true, false or a number of steps >= 0); its default
   * is refinement when the growth puts the backward error well above ε.
   */
  private refineSteps(options: SolveOptions): number | boolean {
    const r = options.refine;
    if (r === undefined) return this.growth > AUTO_REFINE_GROWTH;
    if (typeof r === "boolean" || (typeof r === "number" && r >= 0)) return r;
    throw new InputError(`refine must be true, false or a number of steps >= 0, got ${typeof r === "string" ? `"${r}"` : String(r)}`);
  }

  /**
   * Solve A·x = b overwriting b (length n or n×k column-major) with x; returns b. The plain sweeps: never refines.
   * An entry of x beyond the double range is a CapacityError (b then holds the overflowed x).
   */
  solveInPlace(b: Float64Array): Float64Array {
    this.usable();
    const k = this.checkRhs(b), n = this.n, perm = this.input.permutation;
    // Permute into the interleaved layout y[i·k + r] the sweeps use.
    const y = new Float64Array(b.length);
    for (let r = 0; r < k; r++) for (let i = 0; i < n; i++) y[i * k + r] = b[r * n + perm[i]];
    const S = this.kernels.view(), st = this.input.structure, unit = this.method === "ldlt";
    const tmp = k === 1 ? this.solveTmp : new Float64Array(this.solveTmp.length * k);
    forwardSweep(S, st, y, k, unit, tmp, this.recip);
    if (unit) diagonalSweep(y, k, this.recip);
    backwardSweep(S, st, y, k, unit, tmp, this.recip);
    for (let r = 0; r < k; r++) for (let i = 0; i < n; i++) b[r * n + perm[i]] = y[i * k + r];
    requireFinite(b, n);
    return b;
  }

  /** Solve with the normwise backward error reported and iterative refinement (default as in {@link solve}). */
  solveWithInfo(b: Float64Array | number[], given: SolveOptions = {}): SolveInfo {
    const options = optionsObject(given, "solveWithInfo");
    this.usable();
    const rhs = rhsCopy(b);
    this.checkRhs(rhs);
    return refineSolve(this.matrix as SparseMatrix, this.normInf, rhs, (v) => this.solveInPlace(v), this.refineSteps(options));
  }

  /** Number of right-hand sides in b, after checking its length and values. */
  private checkRhs(b: ArrayLike<number>): number {
    requireArray(b);
    const n = this.n;
    if (n === 0 ? b.length !== 0 : b.length === 0 || b.length % n !== 0) {
      throw new InputError(`right-hand side has length ${b.length}, expected n = ${n} or a multiple of it (n×k column-major)`);
    }
    for (let i = 0; i < b.length; i++) {
      if (!Number.isFinite(b[i])) throw new InputError(`right-hand side entry ${i % n} of column ${Math.floor(i / n)} is ${b[i]}, not finite`);
    }
    return n === 0 ? 0 : b.length / n;
  }

  /**
   * log |det A|. For Cholesky det A > 0; for L·D·Lᵀ det A = Π d_j, whose sign
   * is given by {@link determinantSign}.
   */
  logDeterminant(): number {
    this.usable();
    let s = 0;
    this.eachPivot((d) => { s += Math.log(Math.abs(d)); });
    return this.method === "cholesky" ? 2 * s : s;
  }

  /** Sign of det A: +1 or −1 (always +1 for Cholesky). */
  determinantSign(): 1 | -1 {
    const { negative } = this.inertia();
    return negative % 2 === 0 ? 1 : -1;
  }

  /** Inertia from the signs of D (Sylvester); Cholesky implies all positive. `zero` is 0 since tiny pivots stop the factorization. */
  inertia(): Inertia {
    this.usable();
    let positive = 0, negative = 0;
    this.eachPivot((d) => { if (d > 0) positive++; else negative++; });
    return { positive, negative, zero: 0 };
  }

  /** Visit the diagonal of every panel (L_jj for Cholesky, d_j for L·D·Lᵀ). */
  private eachPivot(f: (d: number) => void): void {
    const st = this.input.structure, S = this.kernels.view();
    for (let s = 0; s < st.supernodeCount; s++) {
      const m = st.rowPtr[s + 1] - st.rowPtr[s], c = st.superStart[s + 1] - st.superStart[s];
      for (let j = 0; j < c; j++) f(S[st.factorPtr[s] + j * (m + 1)]);
    }
  }
}

/**
 * CapacityError naming the first entry of a solution that is not finite: with
 * finite A and b that is an entry beyond the double range (a pivot near the
 * bottom of the range, e.g. diag(1e-300) with b = 1e10), which must not pass
 * for a solution (its backward error would even read 0, as ‖x‖∞ = ∞).
 */
function requireFinite(x: Float64Array, n: number): void {
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i])) {
      throw new CapacityError(`solution entry ${i % n} of column ${Math.floor(i / n)} (0-based, original numbering) is ${x[i]}: beyond the range of doubles (about 1.8e308); rescale the system`);
    }
  }
}

/** InputError unless the right-hand side is a typed or plain array. */
function requireArray(b: unknown): void {
  if (!ArrayBuffer.isView(b) && !Array.isArray(b)) {
    throw new InputError(`right-hand side must be a Float64Array or an array of numbers, got ${b === null ? "null" : typeof b}`);
  }
}

/** A Float64Array copy of a right-hand side (checked to be an array first). */
function rhsCopy(b: ArrayLike<number>): Float64Array {
  requireArray(b);
  return Float64Array.from(b);
}

/** Running sum of Σ c_j² along the processing order (structure counts). */
function flopsAlongOrder(input: NumericInput, order: Int32Array): Float64Array {
  const st = input.structure, cum = new Float64Array(order.length);
  let acc = 0;
  for (let k = 0; k < order.length; k++) {
    const s = order[k], m = st.rowPtr[s + 1] - st.rowPtr[s], c = st.superStart[s + 1] - st.superStart[s];
    for (let j = 0; j < c; j++) acc += (m - j) * (m - j);
    cum[k] = acc;
  }
  if (input.flops !== undefined && acc > 0) for (let k = 0; k < cum.length; k++) cum[k] *= input.flops / acc;
  return cum;
}

/** Numeric factorization of A for the structure of an analysis. */
export function factorize(input: NumericInput, A: SparseMatrix, options: FactorOptions = {}): Factorization {
  const F = new Factorization(input, options);
  return F.refactor(A, { onProgress: options.onProgress, signal: options.signal });
}
