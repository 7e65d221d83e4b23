/**
 * Finding credentials in recorded requests so a HAR import can move them into secrets:
 * a field counts as secret by its name (password, token, api_key, session...) or by the look of
 * its value (a JWT, or a long random-looking string).
 */

const SENSITIVE_WORDS = [
  'password', 'passwd', 'passphrase', 'secret', 'token', 'apikey', 'accesskey', 'privatekey',
  'sessionid', 'credential', 'signature', 'authorization', 'csrf', 'xsrf', 'jwt', 'otp', 'bearer',
];
const SENSITIVE_TOKENS = new Set(['pass', 'pwd', 'pw', 'auth', 'sid', 'session', 'key', 'sig', 'pin', 'cookie']);

/** password, api_key, X-Auth-Token, sessionId, client_secret ... */
export function isSensitiveName(name: string): boolean {
  const flat = name.toLowerCase().replace(/[^a-z0-9]/g, '');
  if (SENSITIVE_WORDS.some((w) => flat.includes(w))) return true;
  const tokens = name
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .toLowerCase()
    .split(/[^a-z0-9]+/)
    .filter(Boolean);
  return tokens.some((t) => SENSITIVE_TOKENS.has(t));
}

const JWT = /^eyJ[A-Za-z0-9_-]+\.[A-Za-z0-9_-]+\.[A-Za-z0-9_-]*$/;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const TOKEN_CHARS = /^[A-Za-z0-9._~+/=-]+$/;

/**
 * A JWT, or a string of token characters that is long and mixed enough to be random: 32+
 * characters with letters and digits, or 20+ with upper case, lower case and digits. UUIDs and
 * short ids (24-character hex object ids) stay: they are usually record ids, not credentials.
 */
export function looksLikeToken(value: string): boolean {
  if (JWT.test(value)) return true;
  if (!TOKEN_CHARS.test(value) || UUID.test(value)) return false;
  const letters = /[A-Za-z]/.test(value);
  const digits = /[0-9]/.test(value);
  if (value.length >= 32 && letters && digits) return true;
  return value.length >= 20 && digits && /[a-z]/.test(value) && /[A-Z]/.test(value);
}

/** UPPER_SNAKE secret name from a hint ("x-api-key" → "X_API_KEY"). */
export function secretNameFrom(hint: string): string {
  const name = hint
    .replace(/([a-z0-9])([A-Z])/g, '$1_$2')
    .toUpperCase()
    .replace(/[^A-Z0-9]+/g, '_')
    .replace(/^_+|_+$/g, '')
    .slice(0, 60);
  if (!name) return 'SECRET';
  return /^[0-9]/.test(name) ? `S_${name}` : name;
}

export interface ProposedSecret {
  name: string;
  value: string;
  /** Where the value was found, in words ("header Authorization of entry 3"). */
  source: string;
}

/** One name per distinct value; a name already taken by another value gets a _2, _3 suffix. */
export class SecretCollector {
  private readonly byValue = new Map<string, ProposedSecret>();
  private readonly taken = new Set<string>();

  add(hint: string, value: string, source: string): string {
    const known = this.byValue.get(value);
    if (known) return known.name;
    const base = secretNameFrom(hint);
    let name = base;
    for (let n = 2; this.taken.has(name); n++) name = `${base}_${n}`;
    this.taken.add(name);
    this.byValue.set(value, { name, value, source });
    return name;
  }

  nameOf(value: string): string | undefined {
    return this.byValue.get(value)?.name;
  }

  list(): ProposedSecret[] {
    return [...this.byValue.values()];
  }
}

export const placeholder = (name: string) => `{{secret.${name}}}`;
