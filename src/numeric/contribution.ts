/**
 * Storage of a contribution block: the lower triangle of a symmetric b×b
 * block kept as column panels of CB_PANEL columns, each panel a column-major
 * rectangle from its first diagonal entry down (ld = b − j0 for the panel
 * starting at column j0). It holds b²/2 + O(b·CB_PANEL) doubles instead of a
 * full square's b², and every panel is still one contiguous operand for the
 * dense update, so the kernels run unchanged (akin to the blocked packed
 * formats that keep Level-3 kernels on packed triangles, e.g. Gustavson,
 * Waśniewski, Dongarra & Langou 2010, "Rectangular full packed format for
 * Cholesky's algorithm", ACM TOMS 37(2); reference from memory).
 * The strict upper triangle of each panel's diagonal square is storage only.
 */
import type { DenseKernels } from "../kernels/types.js";

/**
 * Columns per panel (a power of two: offsets use shifts). A block then takes
 * about b²/2 + 32·b doubles. Measured with bench/factor-builds.mjs (CPU
 * time, interleaved runs, 3-D grid 40³, elasticity 16³, 2-D grid 500²): 64
 * factors at 0.91–0.99 of the time of full squares with the wasm kernels;
 * 32 ran up to 1.09 there (the wasm GEMM packs its A operand once per call,
 * so narrower panels pack more) for a stack only 2–5 % smaller there.
 */
export const CB_PANEL = 64;
const SHIFT = 6;

/** Doubles of a b×b contribution block in panel storage. */
export function panelBlockSize(b: number): number {
  const q = b >> SHIFT, r = b - q * CB_PANEL;
  return panelStart(b, q) + r * r;
}

/** Offset of panel p (columns p·CB_PANEL ..) within a block of order b. */
function panelStart(b: number, p: number): number {
  return CB_PANEL * (p * b - (CB_PANEL * p * (p - 1)) / 2);
}

/** Entry (i, j), i ≥ j, of a block of order b sits at columnBase(b, j) + i within the block. */
export function columnBase(b: number, j: number): number {
  const p = j >> SHIFT, j0 = p << SHIFT;
  return panelStart(b, p) + (j - j0) * (b - j0) - j0;
}

/**
 * C −= A·Bᵀ on the lower triangle of the block at `cb` (order b, panel
 * storage), with A and B b×k at a and bOff (leading dims lda, ldb): per panel
 * the diagonal square (lower GEMM) and the rectangle below it.
 */
export function panelUpdate(
  K: DenseKernels, b: number, k: number, a: number, lda: number, bOff: number, ldb: number, cb: number,
): void {
  for (let j0 = 0, p = 0; j0 < b; j0 += CB_PANEL, p++) {
    const w = Math.min(CB_PANEL, b - j0), ld = b - j0, c0 = cb + panelStart(b, p);
    K.gemm(w, w, k, a + j0, lda, bOff + j0, ldb, c0, ld, true);
    if (ld > w) K.gemm(ld - w, w, k, a + j0 + w, lda, bOff + j0, ldb, c0 + w, ld, false);
  }
}
