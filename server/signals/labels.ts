// One label set, one identity: keys sorted, values as text, so the same labels written in another
// order (or arriving over another intake) find the same series.
import crypto from 'node:crypto';

export interface CanonicalLabels {
  labels: Record<string, string>;
  /** JSON of the key-sorted entries: an unambiguous in-memory key. */
  key: string;
}

export function canonicalLabels(input: Record<string, string>): CanonicalLabels {
  const keys = Object.keys(input);
  if (keys.length === 0) return { labels: {}, key: '[]' };
  keys.sort();
  const labels: Record<string, string> = {};
  const entries: string[][] = [];
  for (const k of keys) {
    labels[k] = input[k]!;
    entries.push([k, input[k]!]);
  }
  return { labels, key: JSON.stringify(entries) };
}

/** Stored in series.labels_hash; unique per signal. */
export function labelsHash(key: string): string {
  return crypto.createHash('sha1').update(key).digest('hex');
}
