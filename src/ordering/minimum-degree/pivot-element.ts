/**
 * Approximate minimum degree, part 1 (Amestoy, Davis & Duff 1996, SIAM J.
 * Matrix Anal. Appl. 17(4)): turn the pivot variable into a new element whose
 * clique Lme is the union of its adjacent variables and of the cliques of its
 * adjacent elements (which are absorbed), then compute for every element e
 * that touches Lme the weighted size of Le \ Lme, which the degree update needs.
 */
import { bucketRemove, compact, type MdWorkspace } from "./workspace.js";

/** The pivot's new clique lies in arena[first .. end); its weighted size is cliqueWeight. */
export interface NewElement {
  first: number;
  end: number;
  cliqueWeight: number;
}

/** Gather Lme for pivot `me` (already out of its bucket and flagged with negative weight). */
export function buildElement(s: MdWorkspace, me: number, out: NewElement): void {
  if (s.elementCount[me] === 0) buildInPlace(s, me, out);
  else buildFromElements(s, me, out);
  s.start[me] = out.end > out.first ? out.first : -1;
  s.size[me] = out.end - out.first;
  s.elementCount[me] = 0;
}

/** No adjacent elements: Lme is the pivot's own variable list, filtered in place. */
function buildInPlace(s: MdWorkspace, me: number, out: NewElement): void {
  const { arena, weight } = s;
  const first = s.start[me];
  const stop = first + s.size[me];
  let dst = first;
  let total = 0;
  for (let p = first; p < stop; p++) {
    const i = arena[p];
    const w = weight[i];
    if (w <= 0) continue;
    total += w;
    weight[i] = -w;
    arena[dst++] = i;
    if (i < s.firstHalo) bucketRemove(s, i);
  }
  out.first = first;
  out.end = dst;
  out.cliqueWeight = total;
}

/** Lme is built at the free end of the arena, absorbing each adjacent element. */
function buildFromElements(s: MdWorkspace, me: number, out: NewElement): void {
  const { start, size, weight, mark } = s;
  const elements = s.elementCount[me];
  let first = s.free;
  let total = 0;
  let p = start[me];
  let pStop = p + size[me];
  for (let k = 0; k <= elements; k++) {
    const e = k < elements ? s.arena[p++] : me;
    let q = e === me ? p : start[e];
    let qStop = e === me ? pStop : q + size[e];
    while (q < qStop) {
      const i = s.arena[q++];
      const w = weight[i];
      if (w <= 0) continue;
      if (s.free >= s.arena.length) {
        // Save both cursors as the remaining lists, compact, and reload them.
        if (e !== me) saveList(s, e, q, qStop);
        saveList(s, me, e === me ? q : p, pStop);
        first = compact(s, first, s.n);
        p = start[me];
        pStop = p < 0 ? p : p + size[me];
        q = e === me ? p : start[e];
        qStop = q < 0 ? q : q + (e === me ? size[me] : size[e]);
      }
      total += w;
      weight[i] = -w;
      s.arena[s.free++] = i;
      if (i < s.firstHalo) bucketRemove(s, i); // halo variables are in no bucket
    }
    if (e !== me) {
      start[e] = -1;
      size[e] = 0;
      mark[e] = 0; // absorbed into me
    }
  }
  out.first = first;
  out.end = s.free;
  out.cliqueWeight = total;
}

function saveList(s: MdWorkspace, j: number, from: number, to: number): void {
  s.start[j] = to > from ? from : -1;
  s.size[j] = to > from ? to - from : 0;
}

/**
 * For each element e adjacent to a variable of Lme, set mark[e] = mark0 + |Le \ Lme|
 * (weighted). Elements first met this round start from their clique weight.
 */
export function externalSizes(s: MdWorkspace, el: NewElement): void {
  const { arena, start, elementCount, weight, mark, degree } = s;
  const mark0 = s.mark0;
  for (let pm = el.first, pmEnd = el.end; pm < pmEnd; pm++) {
    const i = arena[pm];
    const wi = -weight[i];
    const p0 = start[i];
    const p1 = p0 + elementCount[i];
    for (let p = p0; p < p1; p++) {
      const e = arena[p];
      const m = mark[e];
      if (m >= mark0) mark[e] = m - wi;
      else if (m !== 0) mark[e] = degree[e] + mark0 - wi;
    }
  }
}
