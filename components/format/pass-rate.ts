import type { JourneySummary } from '../../shared/schemas/journeys';

function percent(share: number): string {
  return (share * 100).toFixed(1);
}

/**
 * "99.2 % (97.1–99.8)": the share of passing runs and its Wilson 95 % interval. With no
 * (non-void) runs there is no rate at all, which is not 0 %.
 */
export function formatPassRate(rate: JourneySummary['passRate']): string {
  if (rate.rate === null || rate.total === 0) return 'no runs yet';
  const interval = rate.low !== null && rate.high !== null ? ` (${percent(rate.low)}–${percent(rate.high)})` : '';
  return `${percent(rate.rate)} %${interval}`;
}

/** "118 of 119 runs" for the line under the rate. */
export function formatRunCount(rate: JourneySummary['passRate']): string {
  return rate.total === 0 ? 'void runs are not counted' : `${rate.passed} of ${rate.total} runs passed`;
}
