import { type HarEntryKind, KEPT_KINDS, classifyHarEntry } from './har-classify';
import { type HarDocument, type HarEntry, harDocumentSchema, harEntryTime } from './har-schema';
import { SWEEP_MIN_LENGTH, draftBody, draftHeaders, draftUrl, hiddenPath, previewUrl, setCookieValues, sweep } from './har-draft-request';
import { type ProposedSecret, SecretCollector } from './har-secrets';
import { JOURNEY_LIMITS, type JourneyDocumentInput } from './journey-schema';
import type { Schedule } from './schedule-schema';
import type { StepInput } from './step-schema';

/**
 * HAR 1.2 → draft journey. The draft holds `{{secret.NAME}}` placeholders where the recording
 * had credentials; the values come back separately in `secrets` for the caller to store
 * encrypted, and appear nowhere in the draft or the entry preview.
 */

export class HarImportError extends Error {
  constructor(readonly issues: Array<{ path: string; message: string }>) {
    super(`Not a usable HAR 1.2 file: ${issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join('; ')}`);
    this.name = 'HarImportError';
  }
}

export interface HarImportEntry {
  index: number;
  method: string;
  /** Origin and path only (query left out, token-looking path segments hidden). */
  url: string;
  status: number;
  mimeType: string;
  kind: HarEntryKind;
  reason: string;
  kept: boolean;
  timeMs: number;
}

export interface HarImportResult {
  entries: HarImportEntry[];
  draft: JourneyDocumentInput;
  secrets: ProposedSecret[];
  warnings: string[];
}

export interface HarImportOptions {
  name?: string;
  vantages?: string[];
  schedule?: Schedule;
}

const DEFAULT_SCHEDULE: Schedule = { kind: 'interval', everySeconds: 300 };
function issuePath(path: PropertyKey[]): string {
  return path.map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`)).join('').replace(/^\./, '');
}

export function parseHar(input: string | unknown): HarDocument {
  let raw = input;
  if (typeof input === 'string') {
    try {
      raw = JSON.parse(input);
    } catch (error) {
      throw new HarImportError([{ path: '', message: `the file is not JSON (${error instanceof Error ? error.message : String(error)})` }]);
    }
  }
  const parsed = harDocumentSchema.safeParse(raw);
  if (!parsed.success) {
    throw new HarImportError(parsed.error.issues.map((i) => ({ path: issuePath(i.path), message: i.message })));
  }
  return parsed.data;
}

function followsRedirect(from: HarEntry, to: HarEntry): boolean {
  if (from.response.status < 300 || from.response.status > 399) return false;
  const location = from.response.redirectURL || from.response.headers.find((h) => h.name.toLowerCase() === 'location')?.value;
  if (!location) return false;
  try {
    return new URL(location, from.request.url).href === new URL(to.request.url).href;
  } catch {
    return false;
  }
}

export function importHar(input: string | unknown, options: HarImportOptions = {}): HarImportResult {
  const har = parseHar(input);
  const order = har.log.entries
    .map((entry, index) => ({ entry, index }))
    .sort((a, b) => Date.parse(a.entry.startedDateTime) - Date.parse(b.entry.startedDateTime) || a.index - b.index);
  const secrets = new SecretCollector();
  const warnings: string[] = [];
  const previews: HarImportEntry[] = [];
  const steps: StepInput[] = [];
  let previousKept: { entry: HarEntry; index: number; step: StepInput } | null = null;

  for (const { entry, index } of order) {
    const source = `entry ${index}`;
    const { kind, reason } = classifyHarEntry(entry);
    const preview: HarImportEntry = {
      index,
      method: entry.request.method.toUpperCase(),
      url: previewUrl(entry.request.url),
      status: entry.response.status,
      mimeType: entry.response.content.mimeType,
      kind,
      reason,
      kept: false,
      timeMs: entry.time,
    };
    previews.push(preview);
    // HAR 1.2: time is the sum of the non-negative timings (ssl being part of connect).
    if (Math.abs(harEntryTime(entry.timings) - entry.time) > 1) {
      warnings.push(`${source}: time ${entry.time} ms differs from the sum of its timings (${harEntryTime(entry.timings)} ms)`);
    }
    if (!KEPT_KINDS.has(kind)) continue;
    if (previousKept && followsRedirect(previousKept.entry, entry)) {
      // The browser followed a redirect: one step that follows it replaces the two entries.
      previousKept.step.followRedirects = true;
      previousKept.step.assertions = [{ kind: 'status', in: [entry.response.status] }];
      previousKept.entry = entry;
      preview.reason = `reached by the redirect of entry ${previousKept.index}`;
      continue;
    }
    if (steps.length >= JOURNEY_LIMITS.maxSteps) {
      warnings.push(`${source} and later ones were left out: a journey has at most ${JOURNEY_LIMITS.maxSteps} steps`);
      break;
    }
    const method = preview.method;
    const url = new URL(entry.request.url);
    let body = draftBody(entry, secrets, source);
    if (body !== undefined && (method === 'GET' || method === 'HEAD')) {
      warnings.push(`${source}: a ${method} request cannot carry a body; it was left out`);
      body = undefined;
    }
    const step: StepInput = {
      name: `${method} ${hiddenPath(url.pathname)}`.slice(0, 100),
      method: method as StepInput['method'],
      url: draftUrl(entry.request.url, secrets, source, warnings),
      headers: draftHeaders(entry, secrets, source),
      ...(body !== undefined ? { body } : {}),
      assertions: entry.response.status > 0 ? [{ kind: 'status', in: [entry.response.status] }] : [],
    };
    steps.push(step);
    preview.kept = true;
    previousKept = { entry, index, step };
  }

  // Values already moved into secrets, and cookie values servers set, are swept from every field.
  const cookieValues = setCookieValues(har.log.entries);
  for (const [value, cookieName] of cookieValues) {
    const inDraft = steps.some((s) => [s.url, s.body ?? '', ...(s.headers ?? []).map((h) => h.value)].some((t) => t.includes(value)));
    if (inDraft) secrets.add(`COOKIE_${cookieName}`, value, `Set-Cookie ${cookieName} in a recorded response`);
  }
  const known: Record<string, string> = {};
  for (const s of secrets.list()) if (s.value.length >= SWEEP_MIN_LENGTH) known[s.name] = s.value;
  for (const step of steps) {
    step.name = sweep(step.name, known);
    step.url = sweep(step.url, known);
    step.headers = (step.headers ?? []).map((h) => ({ name: h.name, value: sweep(h.value, known) }));
    if (step.body !== undefined && step.body !== null) step.body = sweep(step.body, known);
  }
  for (const secret of secrets.list()) {
    if (cookieValues.has(secret.value)) {
      warnings.push(
        `secret ${secret.name} is cookie ${cookieValues.get(secret.value)} set by a server response during the recording: ` +
          'it may expire; consider capturing it from the set-cookie header of an earlier step instead',
      );
    }
  }
  if (steps.length === 0) warnings.push('no document or API requests were found: the draft has no steps yet');

  const firstKept = previews.find((p) => p.kept);
  const draft: JourneyDocumentInput = {
    name: (options.name ?? har.log.pages?.[0]?.title ?? `Imported from ${firstKept ? new URL(firstKept.url).host : 'HAR file'}`).slice(0, 120) || 'Imported journey',
    steps,
    schedule: options.schedule ?? DEFAULT_SCHEDULE,
    vantages: options.vantages ?? [],
    failureQuorum: 1,
    // A recording is a starting point: it runs once someone has reviewed it.
    enabled: false,
  };
  return { entries: previews.sort((a, b) => a.index - b.index), draft, secrets: secrets.list(), warnings };
}
