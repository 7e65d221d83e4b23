import { describe, it, expect } from 'vitest';
import {
  TOLERATING_FACTOR,
  satisfactionCounts,
  satisfactionIndex,
  satisfactionIndexFromCounts,
  satisfactionZone,
} from '../../../shared/stats/satisfaction-index';

// Apdex Technical Specification (Apdex Alliance): score = (satisfied + tolerating / 2) / total;
// satisfied ≤ T, tolerating ≤ 4T, frustrated above. The boundary at exactly T counting as
// satisfied is from memory (REFERENCES.md), hence the explicit edge tests.

describe('satisfaction index', () => {
  it('uses 4T as the end of the tolerating zone', () => {
    expect(TOLERATING_FACTOR).toBe(4);
  });

  it('puts exactly T in satisfied and exactly 4T in tolerating (edges, from memory)', () => {
    expect(satisfactionZone(500, 500)).toBe('satisfied');
    expect(satisfactionZone(500.001, 500)).toBe('tolerating');
    expect(satisfactionZone(2000, 500)).toBe('tolerating');
    expect(satisfactionZone(2000.001, 500)).toBe('frustrated');
  });

  it('counts a response without a time (failed) as frustrated', () => {
    expect(satisfactionZone(NaN, 500)).toBe('frustrated');
    expect(satisfactionZone(Infinity, 500)).toBe('frustrated');
  });

  it('computes (satisfied + tolerating/2) / total', () => {
    // T = 500 ms: 6 satisfied, 2 tolerating, 2 frustrated → (6 + 1) / 10 = 0.7.
    const latencies = [100, 200, 300, 400, 499, 500, 501, 2000, 2001, 9000];
    expect(satisfactionCounts(latencies, 500)).toEqual({ satisfied: 6, tolerating: 2, frustrated: 2 });
    expect(satisfactionIndex(latencies, 500)).toBeCloseTo(0.7, 15);
  });

  it('scores 1 when everyone is satisfied, 0 when everyone is frustrated, 0.5 when all tolerate', () => {
    expect(satisfactionIndexFromCounts({ satisfied: 10, tolerating: 0, frustrated: 0 })).toBe(1);
    expect(satisfactionIndexFromCounts({ satisfied: 0, tolerating: 0, frustrated: 10 })).toBe(0);
    expect(satisfactionIndexFromCounts({ satisfied: 0, tolerating: 10, frustrated: 0 })).toBe(0.5);
  });

  it('is null for no responses and rejects bad inputs', () => {
    expect(satisfactionIndex([], 500)).toBeNull();
    expect(() => satisfactionZone(100, 0)).toThrow(RangeError);
    expect(() => satisfactionIndexFromCounts({ satisfied: -1, tolerating: 0, frustrated: 0 })).toThrow(RangeError);
  });
});
