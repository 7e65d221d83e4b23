// The collection-target form's state, how a stored target fills it, and the input it sends.
import type { CollectionTargetView } from '../../../shared/schemas/signals';

export interface TargetDraft {
  name: string;
  service: string;
  url: string;
  interval: string;
  prefix: string;
  /** "key=value", one per line. */
  labels: string;
  /** Flattened keys ticked in the list of keys seen so far. */
  counterKeys: string[];
  /** Keys not seen yet and patterns with "*", one per line. */
  otherCounterKeys: string;
  enabled: boolean;
}

export const EMPTY_DRAFT: TargetDraft = {
  name: '',
  service: '',
  url: '',
  interval: '60',
  prefix: '',
  labels: '',
  counterKeys: [],
  otherCounterKeys: '',
  enabled: true,
};

export function draftFromTarget(t: CollectionTargetView, seenKeys: readonly string[]): TargetDraft {
  return {
    name: t.name,
    service: t.service,
    url: t.url,
    interval: String(t.intervalSeconds),
    prefix: t.prefix,
    labels: Object.entries(t.labels)
      .map(([k, v]) => `${k}=${v}`)
      .join('\n'),
    counterKeys: t.counterKeys.filter((k) => seenKeys.includes(k)),
    otherCounterKeys: t.counterKeys.filter((k) => !seenKeys.includes(k)).join('\n'),
    enabled: t.enabled,
  };
}

function lines(text: string): string[] {
  return text
    .split('\n')
    .map((l) => l.trim())
    .filter(Boolean);
}

/** The API input, or the label lines that are not "key=value" (checked before the shared schema). */
export function draftToInput(d: TargetDraft): { input: unknown; labelError?: string } {
  const labels: Record<string, string> = {};
  for (const line of lines(d.labels)) {
    const at = line.indexOf('=');
    if (at <= 0) return { input: null, labelError: `"${line}" is not key=value` };
    labels[line.slice(0, at).trim()] = line.slice(at + 1).trim();
  }
  const interval = d.interval.trim() === '' ? NaN : Number(d.interval);
  return {
    input: {
      name: d.name.trim(),
      service: d.service.trim(),
      url: d.url.trim(),
      intervalSeconds: Number.isFinite(interval) ? interval : d.interval,
      prefix: d.prefix,
      labels,
      counterKeys: [...new Set([...d.counterKeys, ...lines(d.otherCounterKeys)])],
      enabled: d.enabled,
    },
  };
}

/** Flattened keys this target has produced: its service's signals under its prefix. */
export function keysFromSignals(signalNames: readonly string[], prefix: string): string[] {
  return signalNames.filter((n) => n.startsWith(prefix) && n.length > prefix.length).map((n) => n.slice(prefix.length)).sort();
}
