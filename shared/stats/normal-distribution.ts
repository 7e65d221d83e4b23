// Standard normal distribution function, accurate in the far tails.

const TWO_OVER_SQRT_PI = 2 / Math.sqrt(Math.PI);
const ONE_OVER_SQRT_PI = 1 / Math.sqrt(Math.PI);

/**
 * Complementary error function erfc(x) = 1 − erf(x). Computed directly rather than as
 * 1 − erf(x) because p-values live in the tail, where that subtraction would lose every
 * significant digit. Below 2: the everywhere-positive series
 * erf(x) = (2/√π) e^(−x²) Σ 2ⁿ x^(2n+1) / (1·3·…·(2n+1)), which has no cancellation; from 2 up:
 * the Laplace continued fraction erfc(x) = e^(−x²)/√π · 1/(x + ½/(x + 1/(x + 3⁄2/(x + …)))),
 * evaluated with the modified Lentz method. Both reach close to double precision.
 */
export function erfc(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x < 0) return 2 - erfc(-x);
  if (x < 2) {
    const x2 = x * x;
    let term = x;
    let sum = x;
    for (let n = 1; n < 200; n++) {
      term *= (2 * x2) / (2 * n + 1);
      sum += term;
      if (term < sum * 1e-17) break;
    }
    return 1 - TWO_OVER_SQRT_PI * Math.exp(-x2) * sum;
  }
  if (x > 27) return 0; // e^(−729) underflows a double
  const tiny = 1e-300;
  let f = x;
  let c = x;
  let d = 0;
  for (let k = 1; k < 1000; k++) {
    const a = k / 2;
    d = x + a * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = x + a / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return (ONE_OVER_SQRT_PI * Math.exp(-x * x)) / f;
}

/** P(Z ≤ z) for a standard normal Z. */
export function normalCdf(z: number): number {
  return 0.5 * erfc(-z / Math.SQRT2);
}

/** P(Z ≥ z) for a standard normal Z, computed directly so small tail areas keep their digits. */
export function normalUpperTail(z: number): number {
  return 0.5 * erfc(z / Math.SQRT2);
}
