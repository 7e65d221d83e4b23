// Least-squares line through a series, and when that line reaches a limit (e.g. disk full).

export interface Point {
  x: number;
  y: number;
}

export interface LinearTrend {
  slope: number;
  intercept: number;
  /** √(SSE / (n − 2)); null with two points, where a line fits exactly and no spread is left. */
  residualSd: number | null;
  /** 1 − SSE/SST; null when every y is equal (no variation to explain). */
  rSquared: number | null;
  n: number;
}

/**
 * Ordinary least-squares fit y = intercept + slope·x. Sums are taken around the means (two
 * passes) rather than from raw sums of squares: x is usually a ms epoch near 1.7e12, whose
 * squares lose every significant digit in double precision, and even the NIST "Norris" data
 * needs centring to reach its certified 15 digits. Null with fewer than two points or when all
 * x are equal (no line is defined); non-finite points are ignored as missing data.
 *
 * For time series, fit on x relative to a recent instant (or pass ms directly: centring keeps
 * the slope accurate, but the intercept is then the value at the epoch, 1970).
 */
export function linearTrend(points: readonly Point[]): LinearTrend | null {
  const pts = points.filter((p) => Number.isFinite(p.x) && Number.isFinite(p.y));
  const n = pts.length;
  if (n < 2) return null;
  let meanX = 0;
  let meanY = 0;
  for (const p of pts) {
    meanX += p.x;
    meanY += p.y;
  }
  meanX /= n;
  meanY /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (const p of pts) {
    const dx = p.x - meanX;
    const dy = p.y - meanY;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  if (sxx === 0) return null;
  const slope = sxy / sxx;
  const intercept = meanY - slope * meanX;
  // Residuals summed directly (not SST − slope·Sxy) to avoid cancellation on near-perfect fits.
  let sse = 0;
  for (const p of pts) {
    const r = p.y - (intercept + slope * p.x);
    sse += r * r;
  }
  return {
    slope,
    intercept,
    residualSd: n > 2 ? Math.sqrt(sse / (n - 2)) : null,
    rSquared: syy > 0 ? 1 - sse / syy : null,
    n,
  };
}

/** The fitted value at x. */
export function trendValueAt(trend: Pick<LinearTrend, 'slope' | 'intercept'>, x: number): number {
  return trend.intercept + trend.slope * x;
}

/**
 * How far after `fromX` (in x units, ms for a time axis) the fitted line reaches `limit`.
 * Returns null when it never does in the future: a flat line, a line heading away from the
 * limit, or a crossing that already lies in the past. The last case is null too because the
 * line has then passed the limit; whether the series is over the limit now is a plain threshold
 * check on the current value, which callers make separately, not a forecast.
 */
export function timeToLimit(
  trend: Pick<LinearTrend, 'slope' | 'intercept'>,
  limit: number,
  fromX: number,
): number | null {
  if (trend.slope === 0 || !Number.isFinite(trend.slope)) return null;
  const crossingX = (limit - trend.intercept) / trend.slope;
  const ahead = crossingX - fromX;
  return ahead >= 0 && Number.isFinite(ahead) ? ahead : null;
}
