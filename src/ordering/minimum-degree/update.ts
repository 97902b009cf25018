/**
 * Approximate minimum degree, part 2 (Amestoy, Davis & Duff 1996, SIAM J.
 * Matrix Anal. Appl. 17(4)): for every variable of the new clique Lme, prune
 * its lists, absorb elements whose clique lies inside Lme (aggressive
 * absorption), eliminate it together with the pivot when only the new element
 * remains (mass elimination), bound its external degree, merge
 * indistinguishable variables found by hashing, and put the survivors back
 * into the degree buckets. Halo variables (index ≥ firstHalo) have their
 * lists pruned like the others but are never mass eliminated, never merged
 * with a non-halo variable and never bucketed (their degree is not kept).
 */
import type { NewElement } from "./pivot-element.js";
import { bucketInsert, emitMembers, Field, joinMembers, type MdWorkspace } from "./workspace.js";

/**
 * Prune lists of Lme's variables and compute the degree part outside Lme; chain
 * the variables by list hash (fields Next and Prev: they are out of their buckets).
 */
export function pruneAndBound(s: MdWorkspace, me: number, el: NewElement, aggressive: boolean): void {
  const { arena, node, hashHead } = s;
  const mark0 = s.mark0;
  const mask = hashMask(s, el.end - el.first);
  for (let pm = el.first, pmEnd = el.end; pm < pmEnd; pm++) {
    const i = arena[pm];
    const bi = i * Field.Count;
    const p1 = node[bi + Field.Start];
    const p2 = p1 + node[bi + Field.Elements];
    const pEnd = p1 + node[bi + Field.Size];
    let pn = p1;
    let deg = 0;
    let hash = 0;
    for (let p = p1; p < p2; p++) {
      const e = arena[p];
      const be = e * Field.Count;
      const m = node[be + Field.Mark];
      if (m === 0) continue;
      const outside = m - mark0;
      if (outside > 0 || !aggressive) {
        deg += outside;
        arena[pn++] = e;
        hash = (hash + e) | 0;
      } else {
        node[be + Field.Start] = -1; // Le inside Lme: absorb e into me
        node[be + Field.Size] = 0;
        node[be + Field.Mark] = 0;
      }
    }
    const elements = pn - p1 + 1;
    node[bi + Field.Elements] = elements;
    const p3 = pn;
    for (let p = p2; p < pEnd; p++) {
      const j = arena[p];
      const w = node[j * Field.Count + Field.Weight];
      if (w <= 0) continue; // in Lme (reached through me), merged, eliminated, or set aside
      deg += w;
      arena[pn++] = j;
      hash = (hash + j) | 0;
    }
    if (elements === 1 && p3 === pn && i < s.firstHalo) {
      massEliminate(s, i, el);
      continue;
    }
    if (deg < node[bi + Field.Degree]) node[bi + Field.Degree] = deg;
    // me goes first: the first variable moves to the end, the first element to p3.
    arena[pn] = arena[p3];
    arena[p3] = arena[p1];
    arena[p1] = me;
    node[bi + Field.Size] = pn - p1 + 1;
    const key = hash & mask;
    node[bi + Field.Prev] = key;
    node[bi + Field.Next] = hashHead[key];
    hashHead[key] = i;
  }
}

/**
 * Buckets used for a clique of `count` variables, as a mask: the power of two
 * above 64·count (few collisions), capped by the table. Identical lists have
 * equal sums, so they meet in one bucket whatever the mask, and the merges do
 * not depend on it; a small part of the table stays in cache, unlike hash % n.
 */
function hashMask(s: MdWorkspace, count: number): number {
  const table = s.hashHead.length;
  return (count < table >> 6 ? 1 << (32 - Math.clz32(count << 6)) : table) - 1;
}

/** Variable i touches nothing but me: it is eliminated right after me. */
function massEliminate(s: MdWorkspace, i: number, el: NewElement): void {
  const node = s.node;
  const bi = i * Field.Count;
  const wi = -node[bi + Field.Weight];
  el.cliqueWeight -= wi;
  s.eliminated += wi;
  node[bi + Field.Weight] = 0;
  node[bi + Field.Start] = -1;
  node[bi + Field.Size] = 0;
  emitMembers(s, i, wi);
}

/** Merge variables of Lme that have identical lists (same hash bucket, then compared). */
export function mergeIndistinguishable(s: MdWorkspace, el: NewElement): void {
  const { arena, node, hashHead } = s;
  const halo = s.firstHalo;
  for (let pm = el.first, pmEnd = el.end; pm < pmEnd; pm++) {
    const bi = arena[pm] * Field.Count;
    if (node[bi + Field.Weight] >= 0) continue;
    const key = node[bi + Field.Prev];
    let a = hashHead[key];
    if (a === -1) continue;
    hashHead[key] = -1;
    for (; a !== -1 && node[a * Field.Count + Field.Next] !== -1; a = node[a * Field.Count + Field.Next]) {
      const ba = a * Field.Count;
      const len = node[ba + Field.Size];
      const ec = node[ba + Field.Elements];
      const pa = node[ba + Field.Start];
      const mk = s.mark0;
      for (let p = pa + 1; p < pa + len; p++) node[arena[p] * Field.Count + Field.Mark] = mk;
      let prev = a;
      for (let b = node[ba + Field.Next]; b !== -1; b = node[b * Field.Count + Field.Next]) {
        const bb = b * Field.Count;
        if (node[bb + Field.Size] === len && node[bb + Field.Elements] === ec && (a < halo) === (b < halo) && sameMarks(s, b, mk)) {
          joinMembers(s, a, -node[ba + Field.Weight], b, -node[bb + Field.Weight]); // weights negative inside Lme
          node[ba + Field.Weight] += node[bb + Field.Weight];
          node[bb + Field.Weight] = 0;
          node[bb + Field.Start] = -1;
          node[bb + Field.Size] = 0;
          node[prev * Field.Count + Field.Next] = node[bb + Field.Next];
        } else prev = b;
      }
      s.mark0 = mk + 1;
    }
  }
}

function sameMarks(s: MdWorkspace, b: number, mk: number): boolean {
  const { arena, node } = s;
  const pb = node[b * Field.Count + Field.Start];
  const stop = pb + node[b * Field.Count + Field.Size];
  for (let p = pb + 1; p < stop; p++) if (node[arena[p] * Field.Count + Field.Mark] !== mk) return false;
  return true;
}

/** Final degrees, buckets, and the clique of me compacted to its principal variables. */
export function finishElement(s: MdWorkspace, me: number, el: NewElement, builtAtEnd: boolean): void {
  const { arena, node } = s;
  const remaining = s.n - s.eliminated;
  const dme = el.cliqueWeight;
  let dst = el.first;
  for (let pm = el.first, pmEnd = el.end; pm < pmEnd; pm++) {
    const i = arena[pm];
    const bi = i * Field.Count;
    const w = node[bi + Field.Weight];
    if (w >= 0) continue; // merged or mass eliminated (weight 0)
    const wi = -w;
    node[bi + Field.Weight] = wi;
    const bound = remaining - wi;
    const d = node[bi + Field.Degree] + dme - wi;
    if (i < s.firstHalo) bucketInsert(s, i, d < bound ? d : bound);
    arena[dst++] = i;
  }
  const len = dst - el.first;
  const bme = me * Field.Count;
  node[bme + Field.Size] = len;
  node[bme + Field.Degree] = dme;
  if (dme > s.maxElement) s.maxElement = dme;
  if (len === 0) {
    node[bme + Field.Start] = -1;
    node[bme + Field.Mark] = 0;
  }
  if (builtAtEnd) s.free = el.first + len;
}
