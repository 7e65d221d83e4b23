// Fisher's exact test on a 2×2 table (release verdict: pass/fail before vs after a deploy).
import { logChoose } from './log-factorial';

/** Which departure from "no difference" the test looks for. */
export type Alternative = 'two-sided' | 'greater' | 'less';

/** [[a, b], [c, d]]: rows are the two groups, columns the two outcomes. */
export type TwoByTwo = readonly [readonly [number, number], readonly [number, number]];

/**
 * Two tables whose probabilities differ by less than this relative amount count as equally
 * probable in the two-sided sum: symmetric tables are mathematically equal but their computed
 * probabilities can differ in the last bits. R's fisher.test uses the same 1 + 10⁻⁷.
 */
const RELATIVE_TOLERANCE = 1e-7;

/**
 * p-value of Fisher's exact test. With all margins fixed, the top-left count a follows a
 * hypergeometric distribution; the test is exact, so it stays valid for the small run counts
 * of a release watch where a chi-squared approximation would not.
 * - 'greater': P(A ≥ a), evidence that the odds ratio (a·d)/(b·c) exceeds 1, i.e. row 1 has
 *   more of column 1 than row 2;
 * - 'less': P(A ≤ a);
 * - 'two-sided': the sum over all tables with the same margins that are no more probable than
 *   the observed one (Fisher's own definition, and R's), not twice the smaller tail.
 * Only the p-value is returned: libraries disagree on the odds-ratio estimate (sample vs
 * conditional MLE), and nothing here needs it.
 */
export function fisherExact(table: TwoByTwo, alternative: Alternative = 'two-sided'): number {
  const [[a, b], [c, d]] = table;
  for (const x of [a, b, c, d]) {
    if (!Number.isInteger(x) || x < 0) throw new RangeError(`table cells must be non-negative integers, got ${x}`);
  }
  const row1 = a + b;
  const row2 = c + d;
  const col1 = a + c;
  const lo = Math.max(0, col1 - row2);
  const hi = Math.min(row1, col1);
  // Unnormalised log probabilities over the support, scaled by the largest before exponentiating
  // so that neither huge factorials nor tiny probabilities overflow or underflow.
  const logWeights: number[] = [];
  let maxLog = -Infinity;
  for (let x = lo; x <= hi; x++) {
    const w = logChoose(row1, x) + logChoose(row2, col1 - x);
    logWeights.push(w);
    if (w > maxLog) maxLog = w;
  }
  const weights = logWeights.map((w) => Math.exp(w - maxLog));
  const total = weights.reduce((s, w) => s + w, 0);
  const observed = weights[a - lo];
  let sum = 0;
  for (let x = lo; x <= hi; x++) {
    const w = weights[x - lo];
    if (alternative === 'greater' ? x >= a : alternative === 'less' ? x <= a : w <= observed * (1 + RELATIVE_TOLERANCE)) {
      sum += w;
    }
  }
  return Math.min(1, sum / total);
}
