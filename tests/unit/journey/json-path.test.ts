import { describe, expect, it } from 'vitest';
import { JsonPathError, evaluateJsonPath, parseJsonPath } from '../../../shared/journey/json-path';

const doc = { items: [{ id: 'tea-101', price: 14.5 }, { id: 'tea-102', tags: ['black'] }], 'odd.key': { 'x y': true }, n: null };

describe('JSON path', () => {
  it('parses the dotted, bracket and root forms to the same segments', () => {
    expect(parseJsonPath('$.items[0].id')).toEqual(['items', 0, 'id']);
    expect(parseJsonPath('items.0.id')).toEqual(['items', '0', 'id']);
    expect(parseJsonPath("$['odd.key'][\"x y\"]")).toEqual(['odd.key', 'x y']);
    expect(parseJsonPath('$')).toEqual([]);
    expect(parseJsonPath('')).toEqual([]);
  });

  it('evaluates both spellings of an array index', () => {
    expect(evaluateJsonPath(doc, '$.items[0].id')).toEqual({ found: true, value: 'tea-101' });
    expect(evaluateJsonPath(doc, 'items.0.id')).toEqual({ found: true, value: 'tea-101' });
    expect(evaluateJsonPath(doc, 'items[1].tags[0]')).toEqual({ found: true, value: 'black' });
    expect(evaluateJsonPath(doc, "$['odd.key']['x y']")).toEqual({ found: true, value: true });
    expect(evaluateJsonPath(doc, '$')).toEqual({ found: true, value: doc });
  });

  it('tells a null value from a missing one', () => {
    expect(evaluateJsonPath(doc, '$.n')).toEqual({ found: true, value: null });
    expect(evaluateJsonPath(doc, '$.missing')).toEqual({ found: false });
    expect(evaluateJsonPath(doc, '$.items[5]')).toEqual({ found: false });
    expect(evaluateJsonPath(doc, '$.items.id')).toEqual({ found: false });
    expect(evaluateJsonPath(doc, '$.n.x')).toEqual({ found: false });
    expect(evaluateJsonPath('text', '$.length')).toEqual({ found: false });
  });

  it('does not walk into inherited properties', () => {
    expect(evaluateJsonPath({}, '$.constructor')).toEqual({ found: false });
    expect(evaluateJsonPath({ a: [] }, '$.a.length')).toEqual({ found: false });
  });

  it('rejects malformed paths with the position', () => {
    for (const bad of ['$.', '$..a', '$[', '$[a]', "$['open", '$[0', 'a b', '$x']) {
      expect(() => parseJsonPath(bad), bad).toThrow(JsonPathError);
    }
    expect(() => parseJsonPath('$.items[x]')).toThrow(/character 9/);
  });
});
