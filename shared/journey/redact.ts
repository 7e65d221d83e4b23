/**
 * Removes secret values from text that leaves the prober (response excerpts, URLs, error
 * messages). Besides the plain value it finds the forms a value usually takes on the wire:
 * URL-encoded (fully, as encodeURI does, as a URL's query or path serializes it, and with + for
 * spaces), JSON-escaped and base64 (standard and URL-safe alphabet, also when the value sits
 * inside a larger base64 string, as in `Basic base64(user:password)`).
 */

const MIN_BASE64_CORE = 4;

function utf8Bytes(value: string): Uint8Array {
  return new TextEncoder().encode(value);
}

function base64(bytes: Uint8Array): string {
  let binary = '';
  for (const b of bytes) binary += String.fromCharCode(b);
  return btoa(binary);
}

/**
 * Base64 of a value that starts `offset` bytes into a larger encoded string. Only the characters
 * decided by the value's own bits are kept: the first ones share bits with preceding bytes and the
 * last ones with following bytes (6 bits per character, 8 per byte).
 */
function base64Cores(value: string): string[] {
  const bytes = utf8Bytes(value);
  const cores: string[] = [];
  for (let offset = 0; offset < 3; offset++) {
    const padded = new Uint8Array(offset + bytes.length);
    padded.set(bytes, offset);
    const encoded = base64(padded);
    const start = Math.ceil((offset * 8) / 6);
    const end = Math.floor(((offset + bytes.length) * 8) / 6);
    const core = encoded.slice(start, end);
    if (core.length >= MIN_BASE64_CORE) {
      cores.push(core, core.replace(/\+/g, '-').replace(/\//g, '_'));
    }
  }
  return cores;
}

/** How the WHATWG URL parser writes a value placed raw in a query or a path (it encodes less than encodeURIComponent). */
function urlSerialized(value: string): string[] {
  try {
    return [new URL(`http://h/?${value}`).search.slice(1), new URL(`http://h/${value}`).pathname.slice(1)];
  } catch {
    return [];
  }
}

export function secretForms(value: string): string[] {
  if (value.length === 0) return [];
  const uri = encodeURIComponent(value);
  const forms = [
    value,
    uri,
    uri.replace(/%20/g, '+'),
    encodeURI(value),
    ...urlSerialized(value),
    JSON.stringify(value).slice(1, -1),
    ...base64Cores(value),
  ];
  return [...new Set(forms)].filter((f) => f.length > 0);
}

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

export type SecretReplacement = (name: string) => string;

export const redactionMark: SecretReplacement = (name) => `[secret:${name}]`;

/**
 * Replaces every form of every secret value with `replacement(name)` in one left-to-right pass,
 * longest form first, so a replacement is never itself rewritten.
 */
export function replaceSecrets(
  text: string,
  secrets: Readonly<Record<string, string>>,
  replacement: SecretReplacement,
  formsOf: (value: string) => string[] = secretForms,
): string {
  const byForm = new Map<string, string>();
  for (const [name, value] of Object.entries(secrets)) {
    for (const form of formsOf(value)) if (form && !byForm.has(form)) byForm.set(form, name);
  }
  if (byForm.size === 0) return text;
  const forms = [...byForm.keys()].sort((a, b) => b.length - a.length);
  const pattern = new RegExp(forms.map(escapeRegExp).join('|'), 'g');
  return text.replace(pattern, (form) => replacement(byForm.get(form)!));
}

/** `[secret:NAME]` in place of every secret value (and its encoded forms). */
export function redactSecrets(text: string, secrets: Readonly<Record<string, string>>): string {
  return replaceSecrets(text, secrets, redactionMark);
}
