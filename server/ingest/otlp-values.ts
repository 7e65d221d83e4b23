// Reading the values of an OTLP/JSON request (or a protobuf one decoded to the same shape) the way
// the OpenTelemetry Protocol specification's JSON encoding writes them: 64-bit integers as decimal
// strings or numbers, doubles as numbers or "NaN"/"Infinity", AnyValue as one of its fields.
// Anything else is a MalformedOtlpError naming where, which the intake answers with 400.
export class MalformedOtlpError extends Error {
  constructor(
    public path: string,
    readonly reason: string,
  ) {
    super(`${path}: ${reason}`);
  }
  /** Paths inside data points are relative until an error needs them whole (no strings per point). */
  within(prefix: string): this {
    this.path = this.path ? `${prefix}.${this.path}` : prefix;
    this.message = `${this.path}: ${this.reason}`;
    return this;
  }
}

export function rethrowWithin(e: unknown, prefix: string): never {
  throw e instanceof MalformedOtlpError ? e.within(prefix) : e;
}

export type Obj = Record<string, unknown>;

export const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

export function list(v: unknown, path: string): unknown[] {
  if (v === undefined || v === null) return [];
  if (!Array.isArray(v)) throw new MalformedOtlpError(path, 'must be a list');
  return v;
}
export function obj(v: unknown, path: string): Obj {
  if (!isObj(v)) throw new MalformedOtlpError(path, 'must be an object');
  return v;
}
export function str(v: unknown, path: string): string {
  if (v === undefined || v === null) return '';
  if (typeof v !== 'string') throw new MalformedOtlpError(path, 'must be a string');
  return v;
}

/** fixed64 nanoseconds as a decimal string or a number → ms (fractions keep microseconds). */
export function nanosToMs(v: unknown, path: string): number | null {
  if (v === undefined || v === null) return null;
  if (typeof v === 'number') {
    if (!Number.isFinite(v) || v < 0) throw new MalformedOtlpError(path, 'must be a non-negative integer');
    return v === 0 ? null : v / 1e6;
  }
  if (typeof v !== 'string' || !/^\d{1,20}$/.test(v)) throw new MalformedOtlpError(path, 'must be nanoseconds as a decimal string or number');
  if (v.length <= 3) return Number(v) === 0 ? null : Number(v) / 1e6;
  // Whole microseconds stay exact in a double; the nanosecond remainder is below storage precision.
  const us = Number(v.slice(0, -3));
  return us === 0 ? null : us / 1000;
}

/** int64 / uint64 as a decimal string or a number. */
export function intValue(v: unknown, path: string): number {
  if (typeof v === 'number') {
    if (!Number.isInteger(v)) throw new MalformedOtlpError(path, 'must be an integer');
    return v;
  }
  if (typeof v === 'string' && /^-?\d{1,20}$/.test(v)) return Number(v);
  throw new MalformedOtlpError(path, 'must be an integer as a decimal string or number');
}

/** double: a number, or proto3 JSON's "NaN" / "Infinity" / "-Infinity" / numeric text. */
export function doubleValue(v: unknown, path: string): number {
  if (typeof v === 'number') return v;
  if (typeof v === 'string') {
    if (v === 'NaN') return NaN;
    if (v === 'Infinity') return Infinity;
    if (v === '-Infinity') return -Infinity;
    if (v.trim() !== '' && Number.isFinite(Number(v))) return Number(v);
  }
  throw new MalformedOtlpError(path, 'must be a number');
}

export function anyValueText(v: unknown, path: string): string {
  if (!isObj(v)) return '';
  if ('stringValue' in v) return str(v.stringValue, `${path}.stringValue`);
  if ('boolValue' in v) return String(v.boolValue === true || v.boolValue === 'true');
  // As text, exactly: an int64 label (an id) past 2^53 must not be rounded into another series.
  if ('intValue' in v) return typeof v.intValue === 'string' && /^-?\d{1,20}$/.test(v.intValue) ? BigInt(v.intValue).toString() : String(intValue(v.intValue, `${path}.intValue`));
  if ('doubleValue' in v) return String(doubleValue(v.doubleValue, `${path}.doubleValue`));
  if ('bytesValue' in v) return str(v.bytesValue, `${path}.bytesValue`);
  if ('arrayValue' in v) {
    const values = list(obj(v.arrayValue, `${path}.arrayValue`).values, `${path}.arrayValue.values`);
    return JSON.stringify(values.map((x, i) => anyValueText(x, `${path}.arrayValue.values.${i}`)));
  }
  if ('kvlistValue' in v) {
    const values = list(obj(v.kvlistValue, `${path}.kvlistValue`).values, `${path}.kvlistValue.values`);
    return JSON.stringify(Object.fromEntries(attributes(values, `${path}.kvlistValue.values`)));
  }
  return '';
}

export function attributes(v: unknown, path: string): Array<[string, string]> {
  const out: Array<[string, string]> = [];
  const items = list(v, path);
  for (let i = 0; i < items.length; i++) {
    try {
      const kv = obj(items[i], 'kv');
      const key = str(kv.key, 'key');
      if (key) out.push([key, anyValueText(kv.value, 'value')]);
    } catch (e) {
      // 'kv' marks the item itself.
      if (e instanceof MalformedOtlpError && e.path === 'kv') e.path = '';
      rethrowWithin(e, `${path}.${i}`);
    }
  }
  return out;
}
