// Factorials and binomial coefficients in log space, for exact tests on large counts.

/** 170! is the largest factorial a double holds; above it only logarithms are usable. */
const TABLE_SIZE = 171;

const LOG_FACTORIALS: Float64Array = (() => {
  const table = new Float64Array(TABLE_SIZE);
  let product = 1;
  for (let n = 1; n < TABLE_SIZE; n++) {
    // Multiplying then taking one log keeps each entry within a few ulps; summing logs instead
    // would accumulate a rounding error per term.
    product *= n;
    table[n] = Math.log(product);
  }
  return table;
})();

const HALF_LOG_TWO_PI = 0.5 * Math.log(2 * Math.PI);

/**
 * ln(n!) for a non-negative integer n. Request counts reach millions, whose factorials overflow
 * any float, so exact tests work with logarithms: a table up to 170, then Stirling's series with
 * four correction terms, whose truncation error above n = 170 is far below double precision.
 */
export function logFactorial(n: number): number {
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`factorial needs a non-negative integer, got ${n}`);
  if (n < TABLE_SIZE) return LOG_FACTORIALS[n];
  const inv = 1 / n;
  const inv2 = inv * inv;
  const series = inv * (1 / 12 - inv2 * (1 / 360 - inv2 * (1 / 1260 - inv2 / 1680)));
  return n * Math.log(n) - n + 0.5 * Math.log(n) + HALF_LOG_TWO_PI + series;
}

/**
 * ln C(n, k); −Infinity when k is outside 0..n, so exp() of it is a clean zero probability
 * rather than a thrown error in the middle of a sum.
 */
export function logChoose(n: number, k: number): number {
  if (!Number.isInteger(n) || n < 0 || !Number.isInteger(k)) {
    throw new RangeError(`binomial coefficient needs integers n ≥ 0 and k, got ${n}, ${k}`);
  }
  if (k < 0 || k > n) return -Infinity;
  return logFactorial(n) - logFactorial(k) - logFactorial(n - k);
}
