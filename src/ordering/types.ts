/**
 * Separator tree of a dissection ordering, in the new numbering.
 * Node i covers the contiguous positions [first[i], end[i]); its own separator
 * occupies [separatorFirst[i], end[i]) (empty for a leaf subdomain), and the
 * ranges of its children partition [first[i], separatorFirst[i]).
 * Nodes are listed children before parents; parent[i] = -1 for roots: one
 * root per connected component, or, when dense rows were set aside, a single
 * root whose separator holds them (numbered last) above all components.
 */
export interface SeparatorTree {
  readonly count: number;
  readonly first: Int32Array;
  readonly separatorFirst: Int32Array;
  readonly end: Int32Array;
  readonly parent: Int32Array;
}

/** What every ordering returns. `permutation[k]` is the original index of the vertex placed at position k. */
export interface OrderingResult {
  readonly permutation: Int32Array;
  readonly separatorTree?: SeparatorTree;
  /** Name of the ordering that ran (useful when a default was chosen). */
  readonly name?: string;
  /** Threads that nested dissection ran on (1 when helpers were not used or could not start). */
  readonly threads?: number;
}
