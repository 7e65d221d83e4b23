// Confidence interval for a proportion (availability = passed / total) by Wilson's score method.

/** Two-sided 95 % normal quantile, to the precision Newcombe (1998) uses. */
export const Z_95 = 1.959964;

export interface ProportionInterval {
  /** The observed proportion successes / trials. */
  estimate: number;
  lower: number;
  upper: number;
}

/**
 * Wilson score interval for successes out of trials. Chosen over the textbook estimate ± z·SE
 * because availability sits near 100 %, exactly where that simple interval collapses to zero
 * width (10/10 would be "100 % ± 0") or spills past 1; Wilson's stays inside [0, 1] and keeps a
 * sensible width for small run counts (Newcombe 1998 compares the methods). Null with no
 * trials: an unknown availability is not 0 % or 100 %.
 */
export function wilsonInterval(successes: number, trials: number, z: number = Z_95): ProportionInterval | null {
  if (!Number.isInteger(trials) || trials < 0) throw new RangeError(`trials must be a non-negative integer, got ${trials}`);
  if (!Number.isInteger(successes) || successes < 0 || successes > trials) {
    throw new RangeError(`successes must be an integer within 0..${trials}, got ${successes}`);
  }
  if (!(z > 0)) throw new RangeError(`z must be positive, got ${z}`);
  if (trials === 0) return null;
  const n = trials;
  const p = successes / n;
  const z2 = z * z;
  const denominator = 1 + z2 / n;
  const center = (p + z2 / (2 * n)) / denominator;
  const half = (z / denominator) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  return {
    estimate: p,
    // At 0 or n successes the bound is exactly 0 or 1 in theory; pin it so rounding cannot
    // print "-0.0000" or "1.0000" for a 99.99 % upper bound.
    lower: successes === 0 ? 0 : Math.max(0, center - half),
    upper: successes === trials ? 1 : Math.min(1, center + half),
  };
}
