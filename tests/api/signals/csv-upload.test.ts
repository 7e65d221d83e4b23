// CSV upload of historical samples: column preview, import with a mapping, per-row error report,
// good rows kept, re-upload idempotent.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addPerson, buildTestApp, signIn, type SignedIn, type TestApp } from '../../helpers/app';

let t: TestApp;
let engineer: SignedIn;
let reviewer: SignedIn;

beforeAll(async () => {
  t = await buildTestApp();
  engineer = await signIn(t, (await addPerson(t, 'engineer')).email);
  reviewer = await signIn(t, (await addPerson(t, 'reviewer')).email);
});
afterAll(() => t.close());

const CSV = [
  'timestamp,host,requests,kind',
  '2026-01-10T00:00:00Z,web-1,100,counter', // row 2
  '2026-01-10T00:01:00Z,web-1,160,counter', // row 3
  'yesterday,web-1,170,counter', // row 4: bad time
  '2026-01-10T00:03:00Z,web-1,lots,counter', // row 5: bad value
  '2026-01-10T00:04:00Z,web-1,200', // row 6: missing field
  '"2026-01-10T00:05:00Z","web-1","230","counter"', // row 7: quoted, fine
  '2026-01-10T00:06:00Z,web-1,250,histogramm', // row 8: bad kind
  '1768003620000,web-2,5,counter', // row 9: ms epoch (2026-01-10T00:07:00Z)
].join('\r\n');

const mapping = {
  time: { column: 'timestamp' },
  value: { column: 'requests' },
  service: { value: 'legacy' },
  signal: { value: 'http.requests' },
  kind: { column: 'kind' },
  labels: { host: 'host' },
};

const upload = (who: SignedIn, csv: string, opts: { preview?: boolean; mapping?: unknown } = {}) => {
  const req = who.agent.post(`/api/signals/csv${opts.preview ? '?preview=1' : ''}`).set('x-csrf-token', who.csrf);
  if (opts.mapping !== undefined) req.field('mapping', JSON.stringify(opts.mapping));
  return req.attach('file', Buffer.from(csv, 'utf8'), { filename: 'history.csv', contentType: 'text/csv' });
};

describe('CSV upload', () => {
  it('previews the columns and first rows so the client can map them', async () => {
    const res = await upload(engineer, CSV, { preview: true });
    expect(res.status).toBe(200);
    expect(res.body.columns).toEqual(['timestamp', 'host', 'requests', 'kind']);
    expect(res.body.rows).toHaveLength(8);
    expect(res.body.rows[0]).toEqual(['2026-01-10T00:00:00Z', 'web-1', '100', 'counter']);
    expect(res.body.delimiter).toBe(',');
    expect(res.body.guesses).toEqual({ time: 'timestamp', value: 'requests' });
    expect(await t.db.knex('samples').count({ n: '*' }).first()).toEqual({ n: 0 });
  });

  it('imports the good rows, reports each bad one by row and field, and stores a re-upload once', async () => {
    const res = await upload(engineer, CSV, { mapping });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ rows: 8, imported: 4, duplicates: 0, rejected: 4, errorsTruncated: false });
    expect(res.body.errors).toEqual([
      { row: 4, field: 'timestamp', message: expect.stringMatching(/"yesterday" is not a time/) },
      { row: 5, field: 'requests', message: '"lots" is not a number' },
      { row: 6, field: '', message: expect.stringMatching(/3 fields where the header has 4/) },
      { row: 8, field: 'kind', message: expect.stringMatching(/kind is one of/) },
    ]);
    const rows = await t.db.knex.raw(
      `SELECT x.labels->>'host' AS host, s.t, s.value FROM samples s JOIN series x ON x.id = s.series_id ORDER BY s.t`,
    );
    expect(rows.rows.map((r: { host: string; t: Date; value: number }) => [r.host, r.t.toISOString(), r.value])).toEqual([
      ['web-1', '2026-01-10T00:00:00.000Z', 100],
      ['web-1', '2026-01-10T00:01:00.000Z', 160],
      ['web-1', '2026-01-10T00:05:00.000Z', 230],
      ['web-2', '2026-01-10T00:07:00.000Z', 5],
    ]);

    const again = await upload(engineer, CSV, { mapping });
    expect(again.body).toMatchObject({ rows: 8, imported: 0, duplicates: 4, rejected: 4 });
    expect(await t.db.knex('samples').count({ n: '*' }).first()).toEqual({ n: 4 });
    expect(await t.db.knex('audit_events').where({ action: 'signals.csv_import' }).count({ n: '*' }).first()).toEqual({ n: 2 });
  });

  it('names a mapped column the file does not have, and a missing mapping or file', async () => {
    const res = await upload(engineer, CSV, { mapping: { ...mapping, value: { column: 'reqs' } } });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('mapping.value.column');
    expect(res.body.error.message).toMatch(/no column named "reqs"/);
    const bad = await upload(engineer, CSV, { mapping: { ...mapping, service: {} } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('mapping.service');
    expect((await upload(engineer, CSV)).body.error.field).toBe('mapping');
    const none = await engineer.agent.post('/api/signals/csv').set('x-csrf-token', engineer.csrf).field('mapping', JSON.stringify(mapping));
    expect(none.status).toBe(400);
    expect(none.body.error.field).toBe('file');
  });

  it('keeps quoted fields with delimiters and line breaks, and reports badly quoted rows by row', async () => {
    const quoted = [
      'timestamp,host,requests',
      '2026-01-11T00:00:00Z,"web-1, east",10', // row 2: a comma inside quotes (RFC 4180 §2.6)
      '2026-01-11T00:01:00Z,"web-1\r\neast",20', // row 3: a line break inside quotes (§2.6), two lines of the file
      '2026-01-11T00:02:00Z,web-1 "east",30', // row 4: a quote in an unquoted field (§2.5)
      '2026-01-11T00:03:00Z,"web-1" east,40', // row 5: text after the closing quote (§2.7)
      '2026-01-11T00:04:00Z,"web-1 ""east""",50', // row 6: quotes written twice (§2.7)
    ].join('\r\n');
    const quotedMapping = { ...mapping, signal: { value: 'quoted.requests' }, kind: { value: 'counter' } };
    const res = await upload(engineer, quoted, { mapping: quotedMapping });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ rows: 5, imported: 3, duplicates: 0, rejected: 2 });
    expect(res.body.errors).toEqual([
      { row: 4, field: '', message: expect.stringMatching(/§2\.5/) },
      { row: 5, field: '', message: expect.stringMatching(/§2\.7/) },
    ]);
    const rows = await t.db.knex.raw(
      `SELECT x.labels->>'host' AS host, s.value FROM samples s JOIN series x ON x.id = s.series_id JOIN signals g ON g.id = x.signal_id
       WHERE g.name = 'quoted.requests' ORDER BY s.t`,
    );
    expect(rows.rows).toEqual([
      { host: 'web-1, east', value: 10 },
      { host: 'web-1\r\neast', value: 20 },
      { host: 'web-1 "east"', value: 50 },
    ]);
    const again = await upload(engineer, quoted, { mapping: quotedMapping });
    expect(again.body).toMatchObject({ rows: 5, imported: 0, duplicates: 3, rejected: 2 });
  });

  it('is for engineers and admins only', async () => {
    expect((await upload(reviewer, CSV, { preview: true })).status).toBe(403);
  });
});
