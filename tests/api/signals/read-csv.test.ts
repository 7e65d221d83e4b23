// Reading uploaded CSV (csv-parse underneath) against the rules of RFC 4180 §2 (Shafranovich,
// "Common Format and MIME Type for Comma-Separated Values (CSV) Files", 2005). Each example is the
// RFC's own or built from the rule named beside it. What the importer does with the records is in
// csv-upload.test.ts.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { detectDelimiter, readCsv, type CsvRecord } from '../../../server/signals/csv/read-csv';

async function* chunked(text: string | Buffer, cuts: number[] = []) {
  const bytes = typeof text === 'string' ? Buffer.from(text, 'utf8') : text;
  let at = 0;
  for (const c of [...cuts].sort((a, b) => a - b)) {
    if (c <= at || c >= bytes.length) continue;
    yield bytes.subarray(at, c);
    at = c;
  }
  yield bytes.subarray(at);
}

async function parse(text: string | Buffer, cuts: number[] = []): Promise<CsvRecord[]> {
  const out: CsvRecord[] = [];
  for await (const r of readCsv(chunked(text, cuts), { delimiter: ',' })) out.push(r);
  return out;
}
const fields = async (text: string) => (await parse(text)).map((r) => r.fields);

describe('RFC 4180 §2', () => {
  it('rule 1: each record on its own line, ended by CRLF (LF or CR alone accepted too)', async () => {
    // RFC 4180 §2.1 example: aaa,bbb,ccc CRLF zzz,yyy,xxx CRLF
    expect(await fields('aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n')).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
    expect(await fields('aaa,bbb,ccc\nzzz,yyy,xxx\n')).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
    expect(await fields('aaa,bbb\r\nccc,ddd\neee,fff\rggg,hhh')).toEqual([['aaa', 'bbb'], ['ccc', 'ddd'], ['eee', 'fff'], ['ggg', 'hhh']]);
  });

  it('rule 2: the last record may have no line break', async () => {
    // RFC 4180 §2.2 example: aaa,bbb,ccc CRLF zzz,yyy,xxx
    expect(await fields('aaa,bbb,ccc\r\nzzz,yyy,xxx')).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
  });

  it('rule 3: a header is an ordinary record, numbered 1; blank lines are not records', async () => {
    // RFC 4180 §2.3 example: field_name,field_name,field_name CRLF aaa,bbb,ccc CRLF zzz,yyy,xxx CRLF
    const recs = await parse('field_name,field_name,field_name\r\naaa,bbb,ccc\r\n\r\nzzz,yyy,xxx\r\n');
    expect(recs.map((r) => r.record)).toEqual([1, 2, 3]);
    expect(recs[0]!.fields).toEqual(['field_name', 'field_name', 'field_name']);
  });

  it('rule 4: spaces are part of a field; empty fields count; rows may differ in length', async () => {
    expect(await fields(' aaa , bbb,,\r\n')).toEqual([[' aaa ', ' bbb', '', '']]);
    expect(await fields('a,b,c\r\nd,e\r\n')).toEqual([['a', 'b', 'c'], ['d', 'e']]);
  });

  it('rule 5: fields may be quoted; a quote inside an unquoted field is an error on that record only', async () => {
    // RFC 4180 §2.5 example: "aaa","bbb","ccc" CRLF zzz,yyy,xxx
    expect(await fields('"aaa","bbb","ccc"\r\nzzz,yyy,xxx')).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
    const recs = await parse('a,b"c,d\r\ne,f,g\r\n');
    expect(recs[0]).toMatchObject({ record: 1, error: expect.stringMatching(/§2\.5/) });
    expect(recs[1]).toEqual({ fields: ['e', 'f', 'g'], record: 2 });
  });

  it('rule 6: quoted fields hold line breaks, quotes and commas', async () => {
    // RFC 4180 §2.6 example: "aaa","b CRLF bb","ccc" CRLF zzz,yyy,xxx
    expect(await fields('"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx')).toEqual([['aaa', 'b\r\nbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
    expect(await fields('"a,b","c\nd"\r\n')).toEqual([['a,b', 'c\nd']]);
  });

  it('rule 7: a quote inside a quoted field is written twice; anything else after the closing quote is an error on that record only', async () => {
    // RFC 4180 §2.7 example: "aaa","b""bb","ccc"
    expect(await fields('"aaa","b""bb","ccc"')).toEqual([['aaa', 'b"bb', 'ccc']]);
    expect(await fields('"""quoted"" start",x\r\n')).toEqual([['"quoted" start', 'x']]);
    const recs = await parse('"a"b,c\r\nd,e\r\n"f",g\r\n');
    expect(recs[0]).toMatchObject({ record: 1, error: expect.stringMatching(/§2\.7/) });
    expect(recs.slice(1)).toEqual([
      { fields: ['d', 'e'], record: 2 },
      { fields: ['f', 'g'], record: 3 },
    ]);
  });

  it('a quoted field left open is reported in place of the records it swallowed', async () => {
    const recs = await parse('a,b\r\nc,d\r\n"open,x\r\ny,z\r\n');
    expect(recs.map((r) => [r.record, r.error ?? null])).toEqual([
      [1, null],
      [2, null],
      [3, expect.stringMatching(/not closed/)],
    ]);
  });

  it('gives the same records whatever the chunking (property)', async () => {
    const cell = fc.string({ maxLength: 6 }).map((s) => (/[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s));
    const row = fc.array(cell, { minLength: 1, maxLength: 4 }).filter((r) => r.join(',') !== '');
    const csv = fc.tuple(fc.array(row, { minLength: 1, maxLength: 6 }), fc.constantFrom('\r\n', '\n')).map(([rows, eol]) => rows.map((r) => r.join(',')).join(eol));
    await fc.assert(
      fc.asyncProperty(csv, fc.array(fc.nat({ max: 40 }), { maxLength: 8 }), async (text, cuts) => {
        const whole = await parse(text);
        expect(whole.every((r) => r.error === undefined)).toBe(true);
        expect(await parse(text, cuts)).toEqual(whole);
      }),
    );
  });
});

describe('stream reading', () => {
  it('decodes UTF-8 split across chunks, drops a byte-order mark and detects the delimiter', async () => {
    const bytes = Buffer.from('\ufefftime;wert;ort\n2026-01-01T00:00:00Z;1,5;Zürich\n', 'utf8');
    let delimiter = '';
    const recs = [];
    // Cuts inside the byte-order mark, and between the two bytes of "ü".
    const at = bytes.indexOf(Buffer.from('ü')) + 1;
    for await (const r of readCsv(chunked(bytes, [1, 5, 37, at]), { onDelimiter: (d) => (delimiter = d) })) recs.push(r.fields);
    expect(delimiter).toBe(';');
    expect(recs).toEqual([['time', 'wert', 'ort'], ['2026-01-01T00:00:00Z', '1,5', 'Zürich']]);
    expect(detectDelimiter('a\tb\tc\n')).toBe('\t');
    expect(detectDelimiter('a|b\r')).toBe('|');
  });

  it('stops early without reading the rest of the source', async () => {
    let pulled = 0;
    async function* lines() {
      for (let i = 0; i < 10_000; i++) {
        pulled++;
        yield Buffer.from(`${i},x\n`);
      }
    }
    const seen = [];
    for await (const r of readCsv(lines())) {
      seen.push(r.fields[0]);
      if (seen.length === 3) break;
    }
    expect(seen).toEqual(['0', '1', '2']);
    expect(pulled).toBeLessThan(10_000);
  });
});
