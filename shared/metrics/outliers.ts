// Robust outlier flags by the modified z-score (median and median absolute deviation).
import { median } from './sample';

/**
 * Iglewicz & Hoaglin (1993) recommend flagging |Mᵢ| > 3.5 (constant and threshold quoted from
 * memory of the book, see REFERENCES.md).
 */
export const MODIFIED_Z_THRESHOLD = 3.5;

/** 0.6745 is the 0.75 quantile of the standard normal: it makes MAD comparable to σ. */
const MAD_SCALE = 0.6745;

/** √(π/2): makes the mean absolute deviation comparable to σ for normal data. */
const MEAN_AD_SCALE = 1.253314;

/**
 * Modified z-score of each value, Mᵢ = 0.6745 (xᵢ − median) / MAD. Median and MAD are used
 * instead of mean and standard deviation so that the outliers being hunted cannot inflate the
 * yardstick that is meant to expose them.
 *
 * MAD = 0 (more than half the values identical, common for error counts that are mostly 0)
 * would divide by zero. Choice: fall back to the mean absolute deviation from the median,
 * Mᵢ = (xᵢ − median) / (1.253314 · MeanAD), the fallback IBM documents for this score (from
 * memory). It keeps one spike among zeros flagged while a handful of small values are not all
 * declared outliers, which flagging everything ≠ median would do. If MeanAD is 0 too, every
 * value equals the median and every score is 0. Non-finite inputs give NaN scores and are
 * left out of the median and deviations.
 */
export function modifiedZScores(values: readonly number[]): number[] {
  const finite = values.filter(Number.isFinite);
  const center = median(finite);
  if (center === null) return values.map(() => NaN);
  const deviations = finite.map((x) => Math.abs(x - center));
  const mad = median(deviations) ?? 0;
  let scale: number;
  if (mad > 0) {
    scale = mad / MAD_SCALE;
  } else {
    const meanAd = deviations.reduce((s, d) => s + d, 0) / deviations.length;
    scale = MEAN_AD_SCALE * meanAd;
  }
  return values.map((x) => {
    if (!Number.isFinite(x)) return NaN;
    return scale > 0 ? (x - center) / scale : 0;
  });
}

export interface Outlier {
  index: number;
  value: number;
  score: number;
}

/**
 * Values whose modified z-score exceeds the threshold in absolute value, with their positions
 * so a chart can mark them on the original series.
 */
export function findOutliers(values: readonly number[], threshold: number = MODIFIED_Z_THRESHOLD): Outlier[] {
  const scores = modifiedZScores(values);
  const out: Outlier[] = [];
  scores.forEach((score, index) => {
    if (Math.abs(score) > threshold) out.push({ index, value: values[index], score });
  });
  return out;
}
