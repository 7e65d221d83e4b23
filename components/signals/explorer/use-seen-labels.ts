import { useRef } from 'react';
import type { QueryResult } from '../../../shared/schemas/signals';

type Seen = Map<string, Map<string, Set<string>>>;

/**
 * Label values seen in this signal's answers so far, per signal name (the numerator and a
 * ratio's denominator differ). The API lists label keys but not their values, so filters offer
 * what has been seen; values stay offered after a filter narrows the answer.
 */
export function useSeenLabels(service: string | null, result: QueryResult | undefined): (signal: string) => Record<string, string[]> {
  const store = useRef<{ service: string | null; seen: Seen }>({ service, seen: new Map() });
  if (store.current.service !== service) store.current = { service, seen: new Map() };
  if (result && result.service === service) {
    for (const s of result.series) {
      let byKey = store.current.seen.get(s.signal);
      if (!byKey) store.current.seen.set(s.signal, (byKey = new Map()));
      for (const [k, v] of Object.entries(s.labels)) {
        let values = byKey.get(k);
        if (!values) byKey.set(k, (values = new Set()));
        values.add(v);
      }
    }
  }
  return (signal) => Object.fromEntries([...(store.current.seen.get(signal) ?? new Map<string, Set<string>>()).entries()].map(([k, v]) => [k, [...v].sort()]));
}
