// Binomial tail probabilities: how surprising is a count of errors given the usual error ratio.
import { logChoose } from './log-factorial';

/** ln P(X = k) for X ~ Binomial(n, p), 0 < p < 1. */
export function binomialLogPmf(k: number, n: number, p: number): number {
  return logChoose(n, k) + k * Math.log(p) + (n - k) * Math.log1p(-p);
}

function assertBinomial(k: number, n: number, p: number): void {
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`n must be a non-negative integer, got ${n}`);
  if (!Number.isInteger(k)) throw new RangeError(`k must be an integer, got ${k}`);
  if (!(p >= 0 && p <= 1)) throw new RangeError(`p must be within [0, 1], got ${p}`);
}

/**
 * P(X ≥ k) for X ~ Binomial(n, p): the spike test's p-value, the chance of seeing at least k
 * errors among n requests if the error ratio were still the baseline p. A small value means the
 * window is worse than bad luck explains.
 *
 * Summed term by term from the log-space probability of the first term, walking away from the
 * mean with the ratio P(i+1)/P(i) = (n−i)/(i+1) · p/(1−p), so terms shrink geometrically and the
 * walk stops once they no longer change the sum: O(√(n·p·(1−p))) steps even for millions of
 * requests. When k is at or below the mean the complement 1 − P(X ≤ k−1) is summed instead,
 * which is then the short side. Relative accuracy is about 1e−9 for n near 10⁶ (the log
 * factorials carry an absolute error of a few ulps of ln n!), ample for a significance test.
 */
export function binomialUpperTail(k: number, n: number, p: number): number {
  assertBinomial(k, n, p);
  if (k <= 0) return 1;
  if (k > n) return 0;
  if (p === 0) return 0;
  if (p === 1) return 1;
  const odds = p / (1 - p);
  if (k > n * p) {
    let term = Math.exp(binomialLogPmf(k, n, p));
    let sum = 0;
    for (let i = k; i <= n; i++) {
      sum += term;
      term *= ((n - i) / (i + 1)) * odds;
      if (term <= sum * 1e-17) break;
    }
    return Math.min(1, sum);
  }
  // Lower tail P(X ≤ k−1), walking down from k−1.
  let term = Math.exp(binomialLogPmf(k - 1, n, p));
  let sum = 0;
  for (let i = k - 1; i >= 0; i--) {
    sum += term;
    term *= (i / (n - i + 1)) / odds;
    if (term <= sum * 1e-17) break;
  }
  return Math.max(0, 1 - sum);
}
