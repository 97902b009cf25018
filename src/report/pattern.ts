/**
 * The pattern of L the report draws: the symbolic factorization with
 * fundamental supernodes only (Liu, Ng & Peyton 1993, "On finding supernodes
 * for sparse matrix computations", SIAM J. Matrix Anal. Appl. 14(1)), whose
 * stored entries are exactly the nonzeros of L. The analysis itself may merge
 * supernodes (relaxed amalgamation), storing explicit zeros; merging two
 * sibling separators into their parent puts such zeros in the blocks between
 * independent subdomains, which the report outlines as empty.
 */
import type { Graph } from "../graph/types.js";
import { symbolicFactorization } from "../symbolic/index.js";
import type { SupernodalStructure } from "../symbolic/types.js";

/** The exact structure of L under `permutation` (new → old), and the new → old numbering it is stored in. */
export function exactFactorPattern(g: Graph, permutation: Int32Array): { structure: SupernodalStructure; permutation: Int32Array } {
  const s = symbolicFactorization(g, permutation, false);
  return { structure: s.structure, permutation: s.permutation };
}
