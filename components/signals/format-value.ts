// Signal values as people read them; callers draw them in the mono face so columns line up.
import type { QueryFunction } from '../../shared/schemas/signals';

const SI = [
  { at: 1e12, suffix: 'T' },
  { at: 1e9, suffix: 'G' },
  { at: 1e6, suffix: 'M' },
  { at: 1e4, suffix: 'k' },
];

/** Three significant figures, SI suffixes from ten thousand up: 0.00123, 12.3, 1230, 45.6k, 7.89M. */
export function formatNumber(v: number): string {
  if (!Number.isFinite(v)) return '—';
  if (v === 0) return '0';
  const abs = Math.abs(v);
  for (const s of SI) if (abs >= s.at) return `${trim((v / s.at).toPrecision(3))}${s.suffix}`;
  if (abs >= 1000) return String(Math.round(v));
  return trim(v.toPrecision(3));
}

function trim(text: string): string {
  // toPrecision can answer in exponent form for tiny numbers; keep that, but drop trailing zeros.
  if (text.includes('e')) return text;
  return text.includes('.') ? text.replace(/\.?0+$/, '') : text;
}

/** OpenTelemetry unit codes to words people expect: "By" → "B", "1" and "{request}" annotations → "". */
export function unitLabel(unit: string): string {
  const u = unit.trim();
  if (u === '' || u === '1' || /^\{.*\}$/.test(u)) return '';
  if (u === 'By') return 'B';
  return u.replace(/\{.*?\}/g, '');
}

/** Ratio and share answers are fractions, shown as percentages. */
export function isShare(fn: QueryFunction): boolean {
  return fn === 'ratio' || fn === 'share_above';
}

/** What one value of a query means, with its unit: "12.3 /s", "2.35 %", "184 ms", "+0.5 B/s". */
export function formatValue(v: number | null | undefined, fn: QueryFunction, unit: string): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  if (isShare(fn)) return `${formatNumber(v * 100)} %`;
  const u = unitLabel(unit);
  if (fn === 'rate') return `${formatNumber(v)} ${u}/s`;
  if (fn === 'trend') return `${v > 0 ? '+' : ''}${formatNumber(v)} ${u}/s`;
  return u ? `${formatNumber(v)} ${u}` : formatNumber(v);
}

/** Shorter, for axis labels. */
export function formatAxisValue(v: number, fn: QueryFunction): string {
  return isShare(fn) ? `${formatNumber(v * 100)}%` : formatNumber(v);
}

/** "in 3.2 h", "in 12 min", "in 40 s"; null means the trend never reaches the limit. */
export function formatTimeToLimit(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return 'not on this trend';
  if (seconds <= 0) return 'reached';
  if (seconds < 120) return `in ${Math.round(seconds)} s`;
  if (seconds < 7200) return `in ${Math.round(seconds / 60)} min`;
  if (seconds < 172_800) return `in ${formatNumber(seconds / 3600)} h`;
  return `in ${formatNumber(seconds / 86_400)} d`;
}
