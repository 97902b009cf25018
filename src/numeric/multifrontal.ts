/**
 * Supernodal multifrontal numeric factorization, L·Lᵀ or L·D·Lᵀ (Duff & Reid
 * 1983, ACM TOMS 9(3); Liu 1992, "The multifrontal method for sparse matrix
 * solution: theory and practice", SIAM Review 34(1)).
 *
 * Why multifrontal: every supernode's work is three dense calls on blocks
 * that are already contiguous (POTRF on the diagonal block, TRSM on the rows
 * below, one SYRK-like GEMM into the contribution block), so nearly all flops
 * run inside the register-tiled kernels, whatever the kernel set. The sparse
 * bookkeeping is confined to extend-add, which touches each contribution
 * entry once; a left-looking code would instead gather and scatter an update
 * for every (descendant, ancestor) pair. The price is the contribution stack,
 * whose peak is predicted (workspace.ts) and reserved once.
 *
 * Store layout: [ factor panels | contribution stack | scratch ]. Supernode
 * s's panel (m×c, ld m) sits at factorPtr[s]; it is zeroed and receives A's
 * entries (scatter.ts) right before s is factored. Its contribution block (order m−c, lower triangle in column
 * panels, contribution.ts) is pushed on the stack above its children's,
 * receives their extend-add and its own update, then slides down over them.
 *
 * Pivot size: a pivot p_j (L_jj² or d_j) is judged against its own
 * diagonal entry, r_j = |a_jj|, or, where a_jj = 0, against the terms it was
 * formed from, r_j = Σ_k l_jk²·|d_k|. Under a change of units D·A·D both p_j
 * and r_j scale by d_j², so p_j / r_j does not depend on the units (the
 * diagonal-scaling invariance of Cholesky, van der Sluis 1969; Higham 2002,
 * §10.1, from memory); the largest entry of row j does not scale so: in
 * D·A·D it is d_j·a_jk·d_k, and a row in small units next to one in large
 * units looked tiny. For Cholesky p_j / a_jj is the pivot of the matrix
 * scaled to unit diagonal. For a quasi-definite [[H, Bᵀ], [B, −C]], Schur
 * complements grow in the Loewner order when the other block is eliminated
 * (H + Bᵀ·C⁻¹·B, C + B·H⁻¹·Bᵀ), so |d_j| / |a_jj| is no smaller than the
 * pivot ratio of H or C alone (Schur-complement monotonicity, common
 * practice): a lone −γ pivot is not tiny however small γ is, and a pivot
 * that cancelled from O(1/γ) back to O(‖H‖) (growth, which refinement
 * repairs) is not taken for a singular matrix.
 */
import type { DenseKernels } from "../kernels/types.js";
import type { SupernodalStructure } from "../symbolic/types.js";
import type { FactorMethod } from "./types.js";
import { columnBase, panelUpdate } from "./contribution.js";
import { assemblePanel, type ScatterMap } from "./scatter.js";
import { contributionSize } from "./workspace.js";

/** Everything one numeric pass needs; arrays are workspaces owned by the caller. */
export interface FrontalPass {
  readonly st: SupernodalStructure;
  readonly kernels: DenseKernels;
  readonly method: FactorMethod;
  readonly order: Int32Array;
  /** A's entries by supernode and their values (assembled into each panel right before it is factored). */
  readonly map: ScatterMap;
  readonly values: Float64Array;
  /** Children of each supernode in processing order (see stackSchedule). */
  readonly childPtr: Int32Array;
  readonly children: Int32Array;
  /** Offset of the stack base (= factor doubles) and of the scratch block. */
  readonly stackBase: number;
  readonly scratch: number;
  /** L·D·Lᵀ: a pivot with |d_j| ≤ pivotTolerance · r_j stops the pass (r_j above); unused by Cholesky. */
  readonly pivotTolerance: number;
  /** Offset of each supernode's contribution block while it waits on the stack. */
  readonly cbOffset: Float64Array;
  /** Workspaces of length n. */
  readonly local: Int32Array;
  readonly rel: Int32Array;
  readonly runEnd: Int32Array;
  /** |a_jj| of each column j (new numbering). */
  readonly diag: Float64Array;
  /** L·D·Lᵀ, in and out: Σ_k l_jk²·|d_k| over the pivots k eliminated so far (new numbering; zero before the pass); the growth too. */
  readonly terms: Float64Array;
  /** Out: smallest relative pivot min_j p_j / r_j and its column (see Factorization). */
  readonly smallest: { ratio: number; position: number };
  /** Out: 1 / (diagonal j of the factor), L_jj or d_j (new numbering), for the solves; written while the supernode is in cache. */
  readonly recip: Float64Array;
  /** Called between supernodes with the supernode just done; may throw (abort). */
  readonly between: (s: number) => void;
}

/** A pivot failure: supernode and local column within it. */
export interface PivotFailure {
  readonly supernode: number;
  readonly column: number;
  readonly pivot: number;
}

/** Run the pass over all supernodes. Returns null on success or the failing pivot. */
export function multifrontal(p: FrontalPass): PivotFailure | null {
  const { st, order, childPtr, children } = p;
  // No reserve happens during the pass, so one view of the store serves it all.
  const S = p.kernels.view();
  let top = p.stackBase;
  for (let k = 0; k < order.length; k++) {
    const s = order[k];
    // The children's blocks are the topmost ones, the first child's lowest.
    const base = childPtr[s] < childPtr[s + 1] ? p.cbOffset[children[childPtr[s]]] : top;
    const size = contributionSize(st, s);
    // Typed arrays drop out-of-range writes silently: guard the predicted bound.
    if (top + size > p.scratch) throw new Error(`internal: contribution stack exceeds its prediction at supernode ${s}`);
    const fail = factorFront(p, S, s, top);
    if (fail) return fail;
    relativePivots(p, S, s);
    // Slide s's block down over its children's (stack pop + push); copyWithin handles the overlap.
    if (base !== top && size > 0) S.copyWithin(base, top, top + size);
    p.cbOffset[s] = base;
    top = base + size;
    p.between(s);
  }
  return null;
}

/** r_j of column j (new numbering): |a_jj|, or for L·D·Lᵀ with a_jj = 0, Σ_k l_jk²·|d_k|. */
function pivotScale(p: FrontalPass, j: number): number {
  return p.diag[j] > 0 || p.method === "cholesky" ? p.diag[j] : p.terms[j];
}

/**
 * Fold s's pivots into p.smallest: p_j = L_jj² (Cholesky) or |d_j|, over
 * r_j; ties go to the lower column, as in a scan in column order. Also
 * writes their reciprocals to p.recip.
 */
function relativePivots(p: FrontalPass, S: Float64Array, s: number): void {
  const st = p.st, m = st.rowPtr[s + 1] - st.rowPtr[s], f = st.superStart[s], c = st.superStart[s + 1] - f;
  const panel = st.factorPtr[s], cholesky = p.method === "cholesky", low = p.smallest;
  for (let j = 0; j < c; j++) {
    const d = S[panel + j * (m + 1)], piv = cholesky ? d * d : Math.abs(d);
    p.recip[f + j] = 1 / d;
    const ratio = piv / pivotScale(p, f + j); // r_j > 0: r_j = 0 gives a zero pivot, which stops the factorization
    if (ratio < low.ratio || (ratio === low.ratio && f + j < low.position)) { low.ratio = ratio; low.position = f + j; }
  }
}

/** Assemble children into supernode s and factor its front; the contribution block goes at `cb`. */
function factorFront(p: FrontalPass, S: Float64Array, s: number, cb: number): PivotFailure | null {
  const { st, kernels: K } = p;
  const r0 = st.rowPtr[s], m = st.rowPtr[s + 1] - r0;
  const c = st.superStart[s + 1] - st.superStart[s], b = m - c;
  const panel = st.factorPtr[s];
  assemblePanel(p.map, s, p.values, S, panel, m * c);
  S.fill(0, cb, cb + contributionSize(st, s));
  for (let t = 0; t < m; t++) p.local[st.rowIdx[r0 + t]] = t;
  extendAddChildren(p, S, s, panel, m, c, cb);
  if (p.method === "cholesky") {
    const f = K.potrf(c, panel, m);
    if (f >= 0) return { supernode: s, column: f, pivot: S[panel + f * (m + 1)] };
    if (b === 0) return null;
    K.trsm(b, c, panel, m, panel + c, m, false);
    panelUpdate(K, b, c, panel + c, m, panel + c, m, cb);
    return null;
  }
  const bad = ldltPanel(p, S, s, panel, m, c);
  if (bad) return bad;
  if (b === 0) return null;
  K.trsm(b, c, panel, m, panel + c, m, true);
  // W = L21·D to scratch, then L21 = W·D⁻¹ in the panel (adding l_ij²·|d_j| to the rows' terms), then CB −= W·L21ᵀ.
  const w = p.scratch, below = st.rowPtr[s] + c, terms = p.terms;
  for (let j = 0; j < c; j++) {
    const col = panel + j * m + c, dj = S[panel + j * (m + 1)], inv = 1 / dj, ad = Math.abs(dj);
    S.copyWithin(w + j * b, col, col + b);
    for (let i = 0; i < b; i++) {
      const l = S[col + i] * inv;
      S[col + i] = l;
      terms[st.rowIdx[below + i]] += l * (l * ad); // l·(l·|d|): no overflow when l is large and |d| small
    }
  }
  panelUpdate(K, b, c, w, b, panel + c, m, cb);
  return null;
}

/**
 * L·D·Lᵀ of s's diagonal block with per-column pivot floors tol·r_j: the
 * kernel stops at the first pivot under tol·min_j r_j taken before the block
 * (r_j can only grow within it), then the pivots it produced are checked in
 * order, each after the block's earlier columns have added their l_jk²·|d_k|
 * to its terms (a pivot is computed the same whether or not a later check
 * rejects it, so the first failing column is the same as with a per-column
 * test in the kernel).
 */
function ldltPanel(p: FrontalPass, S: Float64Array, s: number, panel: number, m: number, c: number): PivotFailure | null {
  const f0 = p.st.superStart[s], tol = p.pivotTolerance, terms = p.terms;
  let floor = Infinity;
  for (let j = 0; j < c; j++) floor = Math.min(floor, tol * pivotScale(p, f0 + j));
  const f = p.kernels.ldlt(c, panel, m, c > 0 ? floor : 0);
  const end = f >= 0 ? f : c;
  for (let j = 0; j < end; j++) {
    const col = panel + j * m, d = S[col + j], ad = Math.abs(d);
    if (ad <= tol * pivotScale(p, f0 + j)) return { supernode: s, column: j, pivot: d };
    for (let i = j + 1; i < c; i++) { const l = S[col + i]; terms[f0 + i] += l * (l * ad); }
  }
  return f >= 0 ? { supernode: s, column: f, pivot: S[panel + f * (m + 1)] } : null;
}

/**
 * Extend-add: add every child's contribution block into s's panel (rows and
 * columns among s's own) or s's contribution block (the rest), through
 * relative indices (`rel`, Liu 1992 §5), split into runs of consecutive
 * parent rows so the inner loops are contiguous.
 */
function extendAddChildren(p: FrontalPass, S: Float64Array, s: number, panel: number, m: number, c: number, cb: number): void {
  const { st, local, rel, runEnd, children } = p;
  const b = m - c;
  for (let k = p.childPtr[s]; k < p.childPtr[s + 1]; k++) {
    const ch = children[k];
    const cr0 = st.rowPtr[ch] + (st.superStart[ch + 1] - st.superStart[ch]);
    const nb = st.rowPtr[ch + 1] - cr0;
    for (let t = 0; t < nb; t++) rel[t] = local[st.rowIdx[cr0 + t]];
    // runEnd[t]: end of the run of consecutive parent rows that contains t.
    for (let t = nb - 1; t >= 0; t--) runEnd[t] = t + 1 < nb && rel[t + 1] === rel[t] + 1 ? runEnd[t + 1] : t + 1;
    const src = p.cbOffset[ch];
    for (let jj = 0; jj < nb; jj++) {
      const pc = rel[jj];
      const dst = pc < c ? panel + pc * m : cb + columnBase(b, pc - c) - c;
      const col = src + columnBase(nb, jj);
      // Each run of consecutive parent rows is a plain contiguous add.
      for (let a = jj; a < nb; ) {
        const e = runEnd[a], d = dst + rel[a] - a;
        for (let ii = a; ii < e; ii++) S[d + ii] += S[col + ii];
        a = e;
      }
    }
  }
}
