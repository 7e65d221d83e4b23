import type { HarEntry } from './har-schema';
import { type SecretCollector, isSensitiveName, looksLikeToken, placeholder } from './har-secrets';
import { replaceSecrets } from './redact';

/**
 * Turning one recorded request into a step's URL, headers and body, with credentials swapped for
 * `{{secret.NAME}}` placeholders (the collector keeps the values).
 */

/** Shorter values are replaced only where they were found, not by searching every string. */
export const SWEEP_MIN_LENGTH = 6;
/** Headers the prober sets itself, that describe one browser connection, or that would turn a check into a cache revalidation. */
const DROPPED_HEADERS = new Set([
  'host', 'content-length', 'connection', 'keep-alive', 'proxy-connection', 'transfer-encoding', 'te', 'upgrade', 'expect',
  'accept-encoding', 'user-agent', 'cookie', 'if-none-match', 'if-modified-since', 'upgrade-insecure-requests',
  'priority', 'pragma', 'cache-control', 'traceparent', 'tracestate',
]);

function decodeForm(text: string): string {
  try {
    return decodeURIComponent(text.replace(/\+/g, ' '));
  } catch {
    return text;
  }
}

/** `a=1&b=2` with secret values swapped for placeholders; other pairs stay byte for byte. */
function secretPairs(query: string, hintPrefix: string, secrets: SecretCollector, source: string): string {
  return query
    .split('&')
    .map((pair) => {
      const eq = pair.indexOf('=');
      if (eq < 0) return pair;
      const name = decodeForm(pair.slice(0, eq));
      const value = decodeForm(pair.slice(eq + 1));
      if (!value || !(isSensitiveName(name) || looksLikeToken(value))) return pair;
      return `${pair.slice(0, eq)}=${placeholder(secrets.add(`${hintPrefix}_${name}`, value, `${source}, ${name}`))}`;
    })
    .join('&');
}

function secretPath(pathname: string, onToken: (previous: string, segment: string) => string): string {
  return pathname
    .split('/')
    .map((segment, i, all) => (looksLikeToken(decodeForm(segment)) ? onToken(all[i - 1] || 'path', decodeForm(segment)) : segment))
    .join('/');
}

export function draftUrl(raw: string, secrets: SecretCollector, source: string, warnings: string[]): string {
  const url = new URL(raw);
  if (url.username || url.password) warnings.push(`${source}: user name and password in the URL were left out; use an Authorization header with a secret`);
  const path = secretPath(url.pathname, (previous, segment) =>
    placeholder(secrets.add(`PATH_${previous}`, segment, `${source}, URL path`)),
  );
  const query = url.search ? `?${secretPairs(url.search.slice(1), 'QUERY', secrets, `${source}, query`)}` : '';
  return `${url.protocol}//${url.host}${path}${query}`;
}

export const hiddenPath = (pathname: string) => secretPath(pathname, () => '[hidden]');

export function previewUrl(raw: string): string {
  const url = new URL(raw);
  return `${url.protocol}//${url.host}${hiddenPath(url.pathname)}`;
}

function parseCookieHeader(value: string): Array<{ name: string; value: string }> {
  return value
    .split(';')
    .map((part) => part.trim())
    .filter(Boolean)
    .map((part) => {
      const eq = part.indexOf('=');
      return eq < 0 ? { name: part, value: '' } : { name: part.slice(0, eq).trim(), value: part.slice(eq + 1).trim() };
    });
}

export function draftHeaders(entry: HarEntry, secrets: SecretCollector, source: string): Array<{ name: string; value: string }> {
  const headers: Array<{ name: string; value: string }> = [];
  for (const { name, value } of entry.request.headers) {
    const lower = name.toLowerCase();
    if (lower.startsWith(':') || lower.startsWith('sec-') || DROPPED_HEADERS.has(lower)) continue;
    if (lower === 'authorization' || lower === 'proxy-authorization') {
      const scheme = /^([A-Za-z][A-Za-z0-9-]*)\s+(\S.*)$/.exec(value);
      const hint = lower.replace('-', '_');
      headers.push({
        name,
        value: scheme
          ? `${scheme[1]} ${placeholder(secrets.add(hint, scheme[2], `${source}, header ${name}`))}`
          : placeholder(secrets.add(hint, value, `${source}, header ${name}`)),
      });
    } else if (value && (isSensitiveName(name) || looksLikeToken(value))) {
      headers.push({ name, value: placeholder(secrets.add(`HEADER_${name}`, value, `${source}, header ${name}`)) });
    } else {
      headers.push({ name, value });
    }
  }
  const cookieHeaders = entry.request.headers.filter((h) => h.name.toLowerCase() === 'cookie');
  const cookies = cookieHeaders.length > 0 ? cookieHeaders.flatMap((h) => parseCookieHeader(h.value)) : entry.request.cookies;
  if (cookies.length > 0) {
    const value = cookies
      .map((c) => `${c.name}=${c.value ? placeholder(secrets.add(`COOKIE_${c.name}`, c.value, `${source}, cookie ${c.name}`)) : ''}`)
      .join('; ');
    headers.push({ name: 'Cookie', value });
  }
  return headers;
}

function secretJson(node: unknown, key: string, secrets: SecretCollector, source: string): unknown {
  if (typeof node === 'string') {
    return node && (isSensitiveName(key) || looksLikeToken(node)) ? placeholder(secrets.add(`BODY_${key}`, node, `${source}, field ${key}`)) : node;
  }
  if (Array.isArray(node)) return node.map((item) => secretJson(item, key, secrets, source));
  if (node !== null && typeof node === 'object') {
    return Object.fromEntries(Object.entries(node).map(([k, v]) => [k, secretJson(v, k, secrets, source)]));
  }
  return node;
}

export function draftBody(entry: HarEntry, secrets: SecretCollector, source: string): string | undefined {
  const post = entry.request.postData;
  if (!post) return undefined;
  const mime = post.mimeType.toLowerCase();
  if (post.text === undefined) {
    if (!post.params || post.params.length === 0) return undefined;
    const form = post.params.map((p) => `${encodeURIComponent(p.name)}=${encodeURIComponent(p.value ?? '')}`).join('&');
    return secretPairs(form, 'BODY', secrets, `${source}, body`);
  }
  if (mime.includes('json')) {
    try {
      return JSON.stringify(secretJson(JSON.parse(post.text), 'body', secrets, `${source}, body`));
    } catch {
      return post.text; // not JSON after all: the sweep below still removes known values
    }
  }
  if (mime.startsWith('application/x-www-form-urlencoded')) return secretPairs(post.text, 'BODY', secrets, `${source}, body`);
  return post.text;
}

/** Values servers handed out in Set-Cookie: a later request that repeats one is replaying a credential. */
export function setCookieValues(entries: HarEntry[]): Map<string, string> {
  const found = new Map<string, string>();
  for (const entry of entries) {
    const fromHeaders = entry.response.headers
      .filter((h) => h.name.toLowerCase() === 'set-cookie')
      .flatMap((h) => h.value.split('\n'))
      .map((line) => parseCookieHeader(line.split(';')[0])[0])
      .filter((c): c is { name: string; value: string } => c !== undefined);
    for (const cookie of [...entry.response.cookies, ...fromHeaders]) {
      if (cookie.value.length >= SWEEP_MIN_LENGTH) found.set(cookie.value, cookie.name);
    }
  }
  return found;
}

/** Replaces known secret values anywhere in a string, leaving existing placeholders alone. */
export function sweep(text: string, values: Record<string, string>): string {
  return text
    .split(/(\{\{.*?\}\})/)
    .map((part, i) => (i % 2 === 1 ? part : replaceSecrets(part, values, placeholder, (v) => [v, encodeURIComponent(v)])))
    .join('');
}
