/** A response as assertions and captures see it. */
export interface ObservedResponse {
  status: number;
  /** Lower-case names; repeated headers as arrays. */
  headers: Readonly<Record<string, string | string[] | undefined>>;
  bodyText: string;
  /** Step time so far (the latency assertions compare against). */
  totalMs: number;
}

export function headerValue(response: ObservedResponse, name: string): string | undefined {
  const value = response.headers[name.toLowerCase()];
  return Array.isArray(value) ? value.join(', ') : value;
}

export function headerValues(response: ObservedResponse, name: string): string[] {
  const value = response.headers[name.toLowerCase()];
  return value === undefined ? [] : Array.isArray(value) ? value : [value];
}

export type ParsedBody = { ok: true; value: unknown } | { ok: false; reason: string };

const parsedBodies = new WeakMap<ObservedResponse, ParsedBody>();

/** The body parsed as JSON, once per response however many assertions and captures ask. */
export function jsonBody(response: ObservedResponse): ParsedBody {
  let parsed = parsedBodies.get(response);
  if (!parsed) {
    try {
      parsed = { ok: true, value: JSON.parse(response.bodyText) };
    } catch (error) {
      parsed = { ok: false, reason: `body is not JSON (${error instanceof Error ? error.message : String(error)})` };
    }
    parsedBodies.set(response, parsed);
  }
  return parsed;
}
