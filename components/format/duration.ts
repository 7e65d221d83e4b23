// Durations as people read them; callers draw them in the mono face so columns line up.

/** "840 ms", "1.25 s", "12.4 s", "3.2 min"; an em dash when there is nothing to show. */
export function formatMs(ms: number | null | undefined): string {
  if (ms === null || ms === undefined || Number.isNaN(ms)) return '—';
  if (ms < 1000) return `${Math.round(ms)} ms`;
  if (ms < 10_000) return `${(ms / 1000).toFixed(2)} s`;
  if (ms < 60_000) return `${(ms / 1000).toFixed(1)} s`;
  return `${(ms / 60_000).toFixed(1)} min`;
}

/** A phase of a waterfall: short, with one decimal under 10 ms where it matters. */
export function formatPhaseMs(ms: number): string {
  if (ms < 10) return `${ms.toFixed(1)} ms`;
  return formatMs(ms);
}
