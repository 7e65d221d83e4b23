/**
 * A deliberately small JSON path, enough to point at one value in an API response.
 *
 * Grammar:
 *
 *   path     := root? segment*            an empty path or `$` alone means the whole document
 *   root     := '$'
 *   segment  := '.' name                  `.items`
 *             | name                      only as the first segment: `items.0.id`
 *             | '[' digits ']'            `[0]`: an array index (no negative or slice forms)
 *             | '[' quoted ']'            `['odd.key']` or `["odd key"]`: any object key
 *   name     := one or more characters other than `.`, `[`, `]`, `'`, `"` and whitespace
 *   quoted   := '...' or "..." with `\` escaping the quote character or a backslash
 *
 * A name made only of digits indexes an array when the value is an array (so `items.0.id` and
 * `$.items[0].id` are the same path) and is an ordinary key on an object. There are no wildcards,
 * filters or recursive descent: a path names at most one value.
 */

export type JsonPathSegment = string | number;

export class JsonPathError extends Error {
  constructor(
    readonly path: string,
    readonly position: number,
    reason: string,
  ) {
    super(`JSON path "${path}" is not valid at character ${position + 1}: ${reason}`);
    this.name = 'JsonPathError';
  }
}

const NAME_STOP = new Set(['.', '[', ']', "'", '"']);

export function parseJsonPath(path: string): JsonPathSegment[] {
  const segments: JsonPathSegment[] = [];
  let i = 0;
  if (path.startsWith('$')) i = 1;
  const readName = (): string => {
    const start = i;
    while (i < path.length && !NAME_STOP.has(path[i]) && !/\s/.test(path[i])) i++;
    if (i === start) throw new JsonPathError(path, start, 'expected a key name');
    return path.slice(start, i);
  };
  // A leading bare name is allowed only when there is no `$` (`items.0.id`).
  if (i === 0 && path.length > 0 && path[0] !== '[') segments.push(readName());
  while (i < path.length) {
    const c = path[i];
    if (c === '.') {
      i++;
      segments.push(readName());
    } else if (c === '[') {
      i++;
      const q = path[i];
      if (q === "'" || q === '"') {
        i++;
        let key = '';
        while (i < path.length && path[i] !== q) {
          if (path[i] === '\\' && i + 1 < path.length) i++;
          key += path[i];
          i++;
        }
        if (i >= path.length) throw new JsonPathError(path, i, `missing closing ${q}`);
        i++;
        segments.push(key);
      } else {
        const start = i;
        while (i < path.length && path[i] >= '0' && path[i] <= '9') i++;
        if (i === start) throw new JsonPathError(path, start, 'expected an array index or a quoted key');
        segments.push(Number(path.slice(start, i)));
      }
      if (path[i] !== ']') throw new JsonPathError(path, i, 'expected ]');
      i++;
    } else {
      throw new JsonPathError(path, i, `unexpected "${c}"`);
    }
  }
  return segments;
}

export type JsonPathResult = { found: true; value: unknown } | { found: false };

export function evaluateJsonPath(document: unknown, path: string | JsonPathSegment[]): JsonPathResult {
  const segments = typeof path === 'string' ? parseJsonPath(path) : path;
  let current: unknown = document;
  for (const segment of segments) {
    if (Array.isArray(current)) {
      const index = typeof segment === 'number' ? segment : /^\d+$/.test(segment) ? Number(segment) : NaN;
      if (!Number.isInteger(index) || index >= current.length) return { found: false };
      current = current[index];
    } else if (current !== null && typeof current === 'object') {
      const key = String(segment);
      if (!Object.prototype.hasOwnProperty.call(current, key)) return { found: false };
      current = (current as Record<string, unknown>)[key];
    } else {
      return { found: false };
    }
  }
  return { found: true, value: current };
}
