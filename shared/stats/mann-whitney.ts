// Mann–Whitney U test: did latencies shift between two samples (before vs after a release)?
import type { Alternative } from './fisher-exact';
import { normalCdf, normalUpperTail } from './normal-distribution';

export interface MannWhitneyResult {
  /** Pairs (a, b) with a > b, ties counting ½: large when sample A tends to be larger. */
  uA: number;
  /** n₁·n₂ − uA. */
  uB: number;
  p: number;
  method: 'exact' | 'normal';
  /** The continuity-corrected z of the normal approximation (absent for the exact method). */
  z?: number;
}

/**
 * Samples below this size on both sides, without ties, get the exact distribution (the same
 * cut-off as R's wilcox.test); larger ones are well served by the normal approximation and
 * would make the exact table needlessly large.
 */
export const EXACT_LIMIT = 50;

interface Ranking {
  rankSumA: number;
  /** Sizes of each group of tied values (only groups of two or more). */
  ties: number[];
}

/** Mid-ranks of the pooled samples: tied values share the mean of the ranks they occupy. */
function rankPooled(a: readonly number[], b: readonly number[]): Ranking {
  const pooled = [...a.map((v) => ({ v, fromA: true })), ...b.map((v) => ({ v, fromA: false }))];
  pooled.sort((x, y) => x.v - y.v);
  let rankSumA = 0;
  const ties: number[] = [];
  for (let i = 0; i < pooled.length; ) {
    let j = i + 1;
    while (j < pooled.length && pooled[j].v === pooled[i].v) j++;
    const midRank = (i + 1 + j) / 2; // ranks i+1 .. j
    for (let k = i; k < j; k++) if (pooled[k].fromA) rankSumA += midRank;
    if (j - i > 1) ties.push(j - i);
    i = j;
  }
  return { rankSumA, ties };
}

/**
 * Number of arrangements of m A's and n B's giving each value of U (index u = 0..m·n), by the
 * recurrence f(i, j, u) = f(i−1, j, u−j) + f(i, j−1, u): the largest of the pooled values is
 * either an A (beating all j B's) or a B. Only additions of positive counts, so no cancellation;
 * counts stay in doubles (C(98, 49) ≈ 2.5e28 keeps 15 significant digits).
 */
export function mannWhitneyExactCounts(m: number, n: number): Float64Array {
  // prev[j] = distribution for (i−1, j); built row by row to keep memory at O(n · m·n).
  let prev: Float64Array[] = Array.from({ length: n + 1 }, () => Float64Array.of(1));
  for (let i = 1; i <= m; i++) {
    const cur: Float64Array[] = [Float64Array.of(1)];
    for (let j = 1; j <= n; j++) {
      const out = new Float64Array(i * j + 1);
      const fromA = prev[j]; // length (i−1)·j + 1, shifted by j
      for (let u = 0; u < fromA.length; u++) out[u + j] += fromA[u];
      const fromB = cur[j - 1]; // length i·(j−1) + 1
      for (let u = 0; u < fromB.length; u++) out[u] += fromB[u];
      cur.push(out);
    }
    prev = cur;
  }
  return prev[n];
}

/** P(U ≤ u) from the exact counts. */
function exactLowerTail(counts: Float64Array, u: number): number {
  let below = 0;
  let total = 0;
  for (let i = 0; i < counts.length; i++) {
    total += counts[i];
    if (i <= u) below += counts[i];
  }
  return below / total;
}

export interface MannWhitneyOptions {
  alternative?: Alternative;
  /** 'auto' (default) picks exact or normal as described below; forcing is for reports and tests. */
  method?: 'auto' | 'exact' | 'normal';
}

/**
 * Mann–Whitney U test of samples A and B. Ranks rather than means, because latencies are skewed
 * with long tails and a few slow requests should not decide a release verdict. 'greater' asks
 * whether A tends to be larger than B (e.g. A = latencies after the deploy).
 *
 * Exact p-value when both samples are smaller than EXACT_LIMIT and there are no ties (two-sided:
 * twice the smaller tail, capped at 1). Otherwise the normal approximation with a continuity
 * correction of ½ towards the mean and σ_U corrected for ties (Lehmann, 1975):
 * √(n₁n₂(n+1)/12 − n₁n₂Σ(t³−t)/(12n(n−1))). If every value is tied, σ_U is 0 and there is no
 * evidence either way: p = 1. Null when either sample is empty. Non-finite values are rejected:
 * a failed request has no latency and belongs in the pass/fail test, not here.
 */
export function mannWhitneyU(
  a: readonly number[],
  b: readonly number[],
  options: MannWhitneyOptions = {},
): MannWhitneyResult | null {
  const { alternative = 'two-sided', method = 'auto' } = options;
  if (![...a, ...b].every(Number.isFinite)) throw new RangeError('samples must hold finite numbers');
  const n1 = a.length;
  const n2 = b.length;
  if (n1 === 0 || n2 === 0) return null;
  const { rankSumA, ties } = rankPooled(a, b);
  const uA = rankSumA - (n1 * (n1 + 1)) / 2;
  const uB = n1 * n2 - uA;

  if (method === 'exact' && ties.length > 0) {
    throw new RangeError('the exact distribution assumes no ties; use the normal approximation');
  }
  const exact = method === 'exact' || (method === 'auto' && n1 < EXACT_LIMIT && n2 < EXACT_LIMIT && ties.length === 0);
  if (exact) {
    const counts = mannWhitneyExactCounts(n1, n2);
    const lower = () => exactLowerTail(counts, uA); // P(U ≤ uA)
    const upper = () => 1 - exactLowerTail(counts, uA - 1); // P(U ≥ uA)
    let p: number;
    if (alternative === 'greater') p = upper();
    else if (alternative === 'less') p = lower();
    else p = Math.min(1, 2 * (uA > (n1 * n2) / 2 ? upper() : lower()));
    return { uA, uB, p, method: 'exact' };
  }

  const n = n1 + n2;
  const tieTerm = ties.reduce((s, t) => s + t * t * t - t, 0);
  const variance = (n1 * n2 * (n + 1)) / 12 - (n1 * n2 * tieTerm) / (12 * n * (n - 1));
  const sigma = Math.sqrt(Math.max(0, variance));
  const diff = uA - (n1 * n2) / 2;
  if (sigma === 0) return { uA, uB, p: 1, method: 'normal', z: 0 };
  const correction = alternative === 'greater' ? 0.5 : alternative === 'less' ? -0.5 : Math.sign(diff) * 0.5;
  const z = (diff - correction) / sigma;
  let p: number;
  if (alternative === 'greater') p = normalUpperTail(z);
  else if (alternative === 'less') p = normalCdf(z);
  else p = Math.min(1, 2 * Math.min(normalCdf(z), normalUpperTail(z)));
  return { uA, uB, p, method: 'normal', z };
}
