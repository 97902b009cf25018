/**
 * The plain-JavaScript dense kernel set: one growable Float64Array store and
 * register-tiled POTRF, L·D·Lᵀ, TRSM and GEMM/SYRK working on offsets into it.
 * Each call to `jsKernels()` creates an independent store; a kernel set
 * belongs to one factorization at a time.
 */
import { CapacityError } from "../../errors.js";
import type { DenseKernels } from "../types.js";
import { gemm } from "./gemm.js";
import { ldlt } from "./ldlt.js";
import { potrf } from "./potrf.js";
import { trsm } from "./trsm.js";

/** Largest store the JS kernel set will try to allocate (doubles): the engine's typed-array limit. */
const MAX_DOUBLES = 2 ** 32 - 1;

/** Create a plain-JS dense kernel set with its own store. */
export function jsKernels(): DenseKernels {
  let store = new Float64Array(0);
  return {
    name: "js",
    reserve(length: number): Float64Array {
      if (!Number.isInteger(length) || length < 0) throw new CapacityError(`cannot reserve ${length} doubles`);
      if (length > store.length) {
        if (length > MAX_DOUBLES) throw new CapacityError(`store of ${length} doubles exceeds the JS typed-array limit`);
        try {
          store = new Float64Array(length);
        } catch (e) {
          throw new CapacityError(`cannot allocate ${length} doubles (${(length * 8 / 2 ** 20).toFixed(0)} MiB): ${String(e)}`);
        }
      }
      return store;
    },
    view: () => store,
    potrf: (n, a, lda) => potrf(store, n, a, lda),
    ldlt: (n, a, lda, tiny) => ldlt(store, n, a, lda, tiny),
    trsm: (m, n, a, lda, b, ldb, unit) => trsm(store, m, n, a, lda, b, ldb, unit),
    gemm: (m, n, k, a, lda, b, ldb, c, ldc, lower) => gemm(store, m, n, k, a, lda, b, ldb, c, ldc, lower),
  };
}
