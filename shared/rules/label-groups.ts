// Label groups: the labels that tell one alert of a rule from another, and their stable key.

export type Labels = Record<string, string>;

/** The group a series belongs to: only the group-by labels, a missing one as '' (as aggregateByLabels does). */
export function groupLabels(labels: Labels, by: readonly string[]): Labels {
  const out: Labels = {};
  for (const name of [...new Set(by)].sort()) out[name] = labels[name] ?? '';
  return out;
}

/** JSON of the key-sorted entries: the same labels always give the same key. */
export function groupKey(labels: Labels): string {
  return JSON.stringify(Object.keys(labels).sort().map((k) => [k, labels[k]]));
}

export function formatLabels(labels: Labels): string {
  const keys = Object.keys(labels).sort();
  return keys.length ? keys.map((k) => `${k}=${labels[k]}`).join(', ') : '(all series)';
}
