// Bay matching: which pieces go side by side in an erection bay, and in which order, so that the
// camber difference between neighbours stays inside the differential tolerance.
//
// The objective, exactly as solved:
//  1. every committed piece (already cleared for this bay) is in the bay;
//  2. the pieces stand in order of projected camber (sorting settles the order: for a chosen set, the
//     sorted order minimises the largest step between neighbours);
//  3. minimise the worst neighbour difference, where the difference of two neighbours is
//     |Δ projected camber| + z·√(σa² + σb²) (the projection intervals, so the margin holds despite
//     them), compared in steps of `resolution` (1/32 in by default: finer is noise);
//  4. among the arrangements as good as that, ship the oldest pieces (largest total age) to free the yard.
// Solved exactly by dynamic programming over the pieces in camber order: O(P²·n), which for a
// 40-position bay and a 200-piece pool is about 1.6 million steps, then once more for step 4.

export interface BayCandidate {
  id: string;
  mark: string;
  /** Projected camber at erection and its 1σ, in mm. */
  camberMm: number;
  sigmaMm: number;
  ageDays: number;
  committed: boolean;
}

export interface BayProposal {
  feasible: boolean;
  /** Pieces in position order 1…n. */
  order: BayCandidate[];
  /** Worst neighbour difference (with the uncertainty allowance), mm, in resolution steps. */
  worstMm: number;
  toleranceMm: number;
  /** tolerance − worst: positive is margin, negative is the shortfall. */
  marginMm: number;
  differencesMm: number[];
  reason?: string;
}

export interface MatchOptions {
  positions: number;
  toleranceMm: number;
  z?: number;
  resolutionMm?: number;
}

/** The difference the objective uses for two neighbours, in whole resolution steps. */
export function neighbourSteps(a: BayCandidate, b: BayCandidate, z: number, resolution: number): number {
  const d = Math.abs(a.camberMm - b.camberMm) + z * Math.sqrt(a.sigmaMm ** 2 + b.sigmaMm ** 2);
  return Math.ceil(d / resolution - 1e-9);
}

export function proposeBay(pool: BayCandidate[], o: MatchOptions): BayProposal {
  const z = o.z ?? 1;
  const res = o.resolutionMm ?? 25.4 / 32;
  const n = o.positions;
  const c = [...pool].sort((a, b) => a.camberMm - b.camberMm || a.id.localeCompare(b.id));
  const P = c.length;
  const committed = c.filter((x) => x.committed).length;
  if (n <= 0) return { feasible: true, order: [], worstMm: 0, toleranceMm: o.toleranceMm, marginMm: o.toleranceMm, differencesMm: [] };
  if (P < n) return fail(`only ${P} suitable pieces for ${n} positions`);
  if (committed > n) return fail(`${committed} pieces are already committed to this bay, more than its ${n} positions`);
  // A chain may not jump over a committed piece: the inner loops stop at the first committed one.
  const firstCommitted = c.findIndex((x) => x.committed);
  const lastCommitted = c.findLastIndex((x) => x.committed);
  const cost = (j: number, i: number): number => neighbourSteps(c[j]!, c[i]!, z, res);
  const INF = Number.POSITIVE_INFINITY;
  const canStart = (i: number): boolean => firstCommitted === -1 || i <= firstCommitted;
  const canEnd = (i: number): boolean => lastCommitted === -1 || i >= lastCommitted;

  // Pass 1: the smallest achievable worst step (min–max over chains of n pieces in camber order).
  let best = new Float64Array(P).fill(INF);
  for (let i = 0; i < P; i++) if (canStart(i)) best[i] = 0;
  for (let k = 2; k <= n; k++) {
    const next = new Float64Array(P).fill(INF);
    for (let i = 0; i < P; i++) {
      for (let j = i - 1; j >= 0; j--) {
        if (best[j]! === INF) {
          if (c[j]!.committed) break;
          continue;
        }
        const v = Math.max(best[j]!, cost(j, i));
        if (v < next[i]!) next[i] = v;
        if (c[j]!.committed) break; // a chain cannot jump over a committed piece
      }
    }
    best = next;
  }
  let worstSteps = INF;
  for (let i = 0; i < P; i++) if (canEnd(i) && best[i]! < worstSteps) worstSteps = best[i]!;
  if (worstSteps === INF) return fail('no arrangement includes every committed piece');

  // Pass 2: the oldest pieces among the arrangements whose worst step equals the optimum.
  const age = new Float64Array(P).fill(-INF);
  const from: Int32Array[] = [];
  for (let i = 0; i < P; i++) if (canStart(i)) age[i] = c[i]!.ageDays;
  let cur = age;
  for (let k = 2; k <= n; k++) {
    const next = new Float64Array(P).fill(-INF);
    const back = new Int32Array(P).fill(-1);
    for (let i = 0; i < P; i++) {
      for (let j = i - 1; j >= 0; j--) {
        if (cur[j]! !== -INF && cost(j, i) <= worstSteps) {
          const v = cur[j]! + c[i]!.ageDays;
          if (v > next[i]!) {
            next[i] = v;
            back[i] = j;
          }
        }
        if (c[j]!.committed) break;
      }
    }
    from.push(back);
    cur = next;
  }
  let end = -1;
  for (let i = 0; i < P; i++) if (canEnd(i) && cur[i]! !== -INF && (end === -1 || cur[i]! > cur[end]!)) end = i;
  const idx = [end];
  for (let k = from.length - 1; k >= 0; k--) idx.unshift(from[k]![idx[0]!]!);
  const order = idx.map((i) => c[i]!);
  const diffs = order.slice(1).map((x, i) => neighbourSteps(order[i]!, x, z, res) * res);
  const worstMm = worstSteps * res;
  const feasible = worstMm <= o.toleranceMm + 1e-9;
  return {
    feasible,
    order,
    worstMm,
    toleranceMm: o.toleranceMm,
    marginMm: o.toleranceMm - worstMm,
    differencesMm: diffs,
    reason: feasible ? undefined : `no arrangement keeps every pair of neighbours within the tolerance: the best leaves a worst pair ${worstMm.toFixed(1)} mm apart, ${(worstMm - o.toleranceMm).toFixed(1)} mm over`,
  };

  function fail(reason: string): BayProposal {
    return { feasible: false, order: [], worstMm: Number.POSITIVE_INFINITY, toleranceMm: o.toleranceMm, marginMm: Number.NEGATIVE_INFINITY, differencesMm: [], reason };
  }
}

/** Differences of a given arrangement (hand placement), in the same measure as the proposal. */
export function arrangementDifferences(order: BayCandidate[], o: { z?: number; resolutionMm?: number }): number[] {
  const res = o.resolutionMm ?? 25.4 / 32;
  return order.slice(1).map((x, i) => neighbourSteps(order[i]!, x, o.z ?? 1, res) * res);
}
