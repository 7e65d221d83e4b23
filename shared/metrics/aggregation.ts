// Sum or mean of series values grouped by chosen label names (instance → zone → global).

/** One series' value at one instant, with the labels that identify it. */
export interface LabelledValue {
  labels: Record<string, string>;
  value: number;
}

export type AggregationOp = 'sum' | 'mean';

/** One group's result: only the grouping labels survive, plus how many series fed the value. */
export interface AggregatedValue {
  labels: Record<string, string>;
  value: number;
  count: number;
}

/**
 * Combines series into groups that share the values of the `by` labels; an empty `by` gives one
 * global group. Labels not listed are dropped from the output, because after summing across
 * instances an instance label would be a lie. A series lacking a grouping label falls into the
 * group where that label is empty (the same convention as Prometheus), so it is counted rather
 * than silently lost. Non-finite values are left out as "no data" so one broken series cannot
 * turn a whole zone into NaN; a group made only of such series does not appear. Groups come back
 * sorted by their label values so charts and tests see a stable order.
 */
export function aggregateByLabels(
  series: readonly LabelledValue[],
  by: readonly string[],
  op: AggregationOp,
): AggregatedValue[] {
  const names = [...new Set(by)].sort();
  const groups = new Map<string, { labels: Record<string, string>; sum: number; count: number }>();
  for (const s of series) {
    if (!Number.isFinite(s.value)) continue;
    const labels: Record<string, string> = {};
    for (const name of names) labels[name] = s.labels[name] ?? '';
    // JSON of the ordered values is an unambiguous key even when values contain separators.
    const key = JSON.stringify(names.map((name) => labels[name]));
    const group = groups.get(key);
    if (group) {
      group.sum += s.value;
      group.count += 1;
    } else {
      groups.set(key, { labels, sum: s.value, count: 1 });
    }
  }
  return [...groups.entries()]
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
    .map(([, g]) => ({ labels: g.labels, value: op === 'sum' ? g.sum : g.sum / g.count, count: g.count }));
}
