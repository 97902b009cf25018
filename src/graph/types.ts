/**
 * The undirected graph of a symmetric sparsity pattern: vertex v's neighbours
 * are neighbours[offsets[v] .. offsets[v+1]), sorted ascending, no self loops,
 * every edge stored in both directions.
 */
export interface Graph {
  readonly n: number;
  readonly offsets: Int32Array;
  readonly neighbours: Int32Array;
}
