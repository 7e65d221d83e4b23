import { describe, expect, it } from 'vitest';
import { formatTraceparent, generateTraceparent, parseTraceparent } from '../../../shared/journey/trace-context';

// W3C Trace Context (Recommendation, 2021), traceparent header, example from §3.2 / Examples.
const EXAMPLE = '00-4bf92f3577b34da6a3ce929d0e0e4736-00f067aa0ba902b7-01';

describe('W3C traceparent', () => {
  it("parses the Recommendation's example", () => {
    expect(parseTraceparent(EXAMPLE)).toEqual({
      ok: true,
      value: { version: '00', traceId: '4bf92f3577b34da6a3ce929d0e0e4736', parentId: '00f067aa0ba902b7', flags: '01', sampled: true },
    });
    expect(formatTraceparent((parseTraceparent(EXAMPLE) as { value: Parameters<typeof formatTraceparent>[0] }).value)).toBe(EXAMPLE);
    // flags 00: not sampled (bit 0 of trace-flags).
    expect(parseTraceparent(EXAMPLE.replace(/01$/, '00'))).toMatchObject({ ok: true, value: { sampled: false } });
  });

  it('applies the format rules', () => {
    // Trace Context: all-zero trace-id and parent-id are invalid.
    expect(parseTraceparent('00-00000000000000000000000000000000-00f067aa0ba902b7-01').ok).toBe(false);
    expect(parseTraceparent('00-4bf92f3577b34da6a3ce929d0e0e4736-0000000000000000-01').ok).toBe(false);
    // Lowercase hex only.
    expect(parseTraceparent(EXAMPLE.toUpperCase()).ok).toBe(false);
    expect(parseTraceparent('00-4BF92F3577B34DA6A3CE929D0E0E4736-00f067aa0ba902b7-01').ok).toBe(false);
    // Version ff is invalid.
    expect(parseTraceparent(`ff${EXAMPLE.slice(2)}`)).toEqual({ ok: false, reason: 'version ff is invalid' });
    // Version 00 is exactly 55 characters; wrong lengths and separators are rejected.
    expect(parseTraceparent(`${EXAMPLE}-extra`).ok).toBe(false);
    expect(parseTraceparent(EXAMPLE.slice(0, 54)).ok).toBe(false);
    expect(parseTraceparent(EXAMPLE.replace(/-/g, '_')).ok).toBe(false);
    expect(parseTraceparent('00-4bf92f3577b34da6a3ce929d0e0e473g-00f067aa0ba902b7-01').ok).toBe(false);
  });

  it('parses a future version by its first four fields (from memory of the Recommendation’s versioning rules)', () => {
    expect(parseTraceparent(`cc${EXAMPLE.slice(2)}-what-the-future-will-be-like`)).toMatchObject({ ok: true, value: { version: 'cc', traceId: '4bf92f3577b34da6a3ce929d0e0e4736' } });
    expect(parseTraceparent(`cc${EXAMPLE.slice(2)}x`).ok).toBe(false);
  });

  it('generates valid sampled version-00 headers with random ids', () => {
    const seen = new Set<string>();
    for (let i = 0; i < 50; i++) {
      const t = generateTraceparent();
      expect(t.header).toMatch(/^00-[0-9a-f]{32}-[0-9a-f]{16}-01$/);
      expect(parseTraceparent(t.header)).toEqual({ ok: true, value: { version: '00', traceId: t.traceId, parentId: t.parentId, flags: '01', sampled: true } });
      seen.add(t.traceId);
    }
    expect(seen.size).toBe(50);
  });

  it('never emits an all-zero id even if the random source returns zeros first', () => {
    let calls = 0;
    const random = (n: number) => (calls++ < 2 ? new Uint8Array(n) : new Uint8Array(n).fill(0xab));
    const t = generateTraceparent(random);
    expect(t.traceId).toBe('ab'.repeat(16));
    expect(t.parentId).toBe('ab'.repeat(8));
    expect(parseTraceparent(t.header).ok).toBe(true);
  });
});
