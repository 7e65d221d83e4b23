// The streaming CSV reader against the rules of RFC 4180 §2 (Shafranovich, "Common Format and
// MIME Type for Comma-Separated Values (CSV) Files", 2005). Each example is the RFC's own or
// built from the rule named beside it.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { detectDelimiter, readCsv, Rfc4180Reader } from '../../../server/signals/csv/rfc4180-reader';

const parse = (text: string) => {
  const r = new Rfc4180Reader();
  return [...r.push(text), ...r.end()];
};
const fields = (text: string) => parse(text).map((r) => r.fields);

describe('RFC 4180 §2', () => {
  it('rule 1: each record on its own line, ended by CRLF (LF alone accepted too)', () => {
    // RFC 4180 §2.1 example: aaa,bbb,ccc CRLF zzz,yyy,xxx CRLF
    expect(fields('aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n')).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
    expect(fields('aaa,bbb,ccc\nzzz,yyy,xxx\n')).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
  });

  it('rule 2: the last record may have no line break', () => {
    // RFC 4180 §2.2 example: aaa,bbb,ccc CRLF zzz,yyy,xxx
    expect(fields('aaa,bbb,ccc\r\nzzz,yyy,xxx')).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
  });

  it('rule 3: a header is an ordinary record, numbered 1', () => {
    // RFC 4180 §2.3 example: field_name,field_name,field_name CRLF aaa,bbb,ccc CRLF zzz,yyy,xxx CRLF
    const recs = parse('field_name,field_name,field_name\r\naaa,bbb,ccc\r\nzzz,yyy,xxx\r\n');
    expect(recs.map((r) => r.record)).toEqual([1, 2, 3]);
    expect(recs[0]!.fields).toEqual(['field_name', 'field_name', 'field_name']);
  });

  it('rule 4: spaces are part of a field; empty fields count', () => {
    expect(fields(' aaa , bbb,,\r\n')).toEqual([[' aaa ', ' bbb', '', '']]);
  });

  it('rule 5: fields may be quoted; a quote inside an unquoted field is an error on that record only', () => {
    // RFC 4180 §2.5 example: "aaa","bbb","ccc" CRLF zzz,yyy,xxx
    expect(fields('"aaa","bbb","ccc"\r\nzzz,yyy,xxx')).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
    const recs = parse('a,b"c,d\r\ne,f,g\r\n');
    expect(recs[0]!.error).toMatch(/§2\.5/);
    expect(recs[1]).toEqual({ fields: ['e', 'f', 'g'], record: 2 });
  });

  it('rule 6: quoted fields hold line breaks, quotes and commas', () => {
    // RFC 4180 §2.6 example: "aaa","b CRLF bb","ccc" CRLF zzz,yyy,xxx
    expect(fields('"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx')).toEqual([['aaa', 'b\r\nbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
  });

  it('rule 7: a quote inside a quoted field is written twice', () => {
    // RFC 4180 §2.7 example: "aaa","b""bb","ccc"
    expect(fields('"aaa","b""bb","ccc"')).toEqual([['aaa', 'b"bb', 'ccc']]);
    expect(parse('"a"b,c\r\n')[0]!.error).toMatch(/§2\.7/);
    expect(parse('"open,x\r\n')[0]!.error).toMatch(/not closed/);
  });

  it('gives the same records whatever the chunking (property)', () => {
    const cell = fc.string({ maxLength: 6 }).map((s) => (/[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s));
    const csv = fc.array(fc.array(cell, { minLength: 1, maxLength: 4 }), { minLength: 1, maxLength: 6 }).map((rows) => rows.map((r) => r.join(',')).join('\r\n'));
    fc.assert(
      fc.property(csv, fc.array(fc.nat({ max: 40 }), { maxLength: 8 }), (text, cuts) => {
        const whole = parse(text);
        const r = new Rfc4180Reader();
        const out = [];
        let at = 0;
        for (const c of [...cuts].sort((a, b) => a - b)) {
          out.push(...r.push(text.slice(at, Math.max(at, c))));
          at = Math.max(at, c);
        }
        out.push(...r.push(text.slice(at)), ...r.end());
        expect(out).toEqual(whole);
      }),
    );
  });
});

describe('stream reading', () => {
  it('decodes UTF-8 split across chunks, drops a byte-order mark and detects the delimiter', async () => {
    const bytes = Buffer.from('\ufefftime;wert;ort\n2026-01-01T00:00:00Z;1,5;Zürich\n', 'utf8');
    const chunks = [bytes.subarray(0, 5), bytes.subarray(5, 37), bytes.subarray(37)];
    async function* gen() {
      for (const c of chunks) yield c;
    }
    let delimiter = '';
    const recs = [];
    for await (const r of readCsv(gen(), { onDelimiter: (d) => (delimiter = d) })) recs.push(r.fields);
    expect(delimiter).toBe(';');
    expect(recs).toEqual([['time', 'wert', 'ort'], ['2026-01-01T00:00:00Z', '1,5', 'Zürich']]);
    expect(detectDelimiter('a\tb\tc\n')).toBe('\t');
  });
});
