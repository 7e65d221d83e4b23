// A JSON document of numbers → (flattened key, value) pairs: nested keys joined with '.', list
// items by their index. Only finite numbers become samples; text, booleans and nulls are skipped
// (a status word is not a metric).

export const MAX_FLATTENED_KEYS = 5000;

export function flattenNumbers(doc: unknown, maxKeys = MAX_FLATTENED_KEYS): Array<[string, number]> {
  const out: Array<[string, number]> = [];
  const walk = (v: unknown, path: string, depth: number) => {
    if (out.length >= maxKeys || depth > 32) return;
    if (typeof v === 'number') {
      if (Number.isFinite(v) && path) out.push([path, v]);
    } else if (Array.isArray(v)) {
      v.forEach((x, i) => walk(x, path ? `${path}.${i}` : String(i), depth + 1));
    } else if (v && typeof v === 'object') {
      for (const [k, x] of Object.entries(v)) walk(x, path ? `${path}.${k}` : k, depth + 1);
    }
  };
  walk(doc, '', 0);
  return out;
}

/** Counter key patterns: exact flattened keys, where `*` stands for one whole key part. */
export function counterMatcher(patterns: string[]): (key: string) => boolean {
  const exact = new Set(patterns.filter((p) => !p.includes('*')));
  const wild = patterns
    .filter((p) => p.includes('*'))
    .map((p) => new RegExp(`^${p.split('.').map((part) => (part === '*' ? '[^.]+' : part.replace(/[.*+?^${}()|[\]\\]/g, '\\$&'))).join('\\.')}$`));
  return (key) => exact.has(key) || wild.some((re) => re.test(key));
}
