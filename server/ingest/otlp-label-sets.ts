// Data point attributes → canonical labels (labels.ts), made once per distinct attribute list of a
// resource, not once per point: points of one series repeat the same attributes, and building
// the labels (or even a key string to look them up by) for each of 10 000 points took most of the
// normaliser's time.
import { canonicalLabels, type CanonicalLabels } from '../signals/labels';
import { attributes } from './otlp-values';

/** A level of the lookup tree: attribute key → string value → the next level. */
interface Level {
  next: Map<string, Map<string, Level>> | null;
  labels: CanonicalLabels | null;
}

const level = (): Level => ({ next: null, labels: null });

export class LabelSets {
  /**
   * Attribute lists of plain strings (what SDKs send for nearly every attribute), looked up one
   * attribute at a time: no key string is built per point, and the attribute strings JSON.parse
   * makes are short enough to come hashed already.
   */
  private readonly strings = level();
  /** Any other attribute list, by a key string of its pairs. */
  private readonly others = new Map<string, CanonicalLabels>();

  /** `instance`: the resource's service.instance.id, which every label set of it carries. */
  constructor(private readonly instance: string | undefined) {}

  /** The labels of a data point's attributes (v); throws MalformedOtlpError for malformed ones. */
  of(v: unknown, path: string): CanonicalLabels {
    const node = this.stringsLevel(v);
    if (node) return (node.labels ??= this.make(attributes(v, path)));
    const pairs = attributes(v, path);
    let key = '';
    for (const [k, x] of pairs) key += `${k}\u0000${x}\u0001`;
    let labels = this.others.get(key);
    if (!labels) this.others.set(key, (labels = this.make(pairs)));
    return labels;
  }

  /** The tree level of attributes that are all { key: non-empty, value: { stringValue } }, else null. */
  private stringsLevel(v: unknown): Level | null {
    if (v === undefined || v === null) return this.strings;
    if (!Array.isArray(v)) return null;
    let node = this.strings;
    for (let i = 0; i < v.length; i++) {
      const kv = v[i] as { key?: unknown; value?: { stringValue?: unknown } } | null;
      if (kv === null || typeof kv !== 'object') return null;
      const key = kv.key;
      const value = kv.value;
      if (typeof key !== 'string' || key === '' || value === null || typeof value !== 'object' || Array.isArray(value)) return null;
      const text = value.stringValue;
      if (typeof text !== 'string') return null;
      node.next ??= new Map();
      let byText = node.next.get(key);
      if (!byText) node.next.set(key, (byText = new Map()));
      let child = byText.get(text);
      if (!child) byText.set(text, (child = level()));
      node = child;
    }
    return node;
  }

  private make(pairs: Array<[string, string]>): CanonicalLabels {
    const input: Record<string, string> = {};
    if (this.instance !== undefined) input['service.instance.id'] = this.instance;
    for (const [k, x] of pairs) input[k] = x;
    return canonicalLabels(input);
  }
}
