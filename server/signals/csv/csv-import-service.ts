// CSV upload of historical samples: a preview to map columns, then a streaming import that keeps
// good rows, reports bad ones by row and field, and stores a re-uploaded file once (the samples'
// unique key turns repeated rows into duplicates).
import type { Knex } from 'knex';
import { batchPointSchema, parseInstantMs, type CsvImportResult, type CsvMapping, type CsvPreview, type CsvRowError } from '../../../shared/schemas/signals';
import type { Principal } from '../../auth/principal';
import { ValidationError } from '../../errors';
import { auditRepo } from '../../repositories/audit';
import { batchPointToIngest } from '../batch-points';
import { ingestService, type IngestPoint } from '../ingest-service';
import { readCsv } from './read-csv';

export const PREVIEW_ROWS = 20;
export const MAX_REPORTED_ERRORS = 1000;
const BATCH = 5000;

/** A time cell → ms. "auto": ISO text, else digits (10 digits or fewer read as seconds, more as ms). */
export function parseTimeCell(text: string, format: CsvMapping['time']['format']): number | null {
  const s = text.trim();
  if (format === 'iso') return /^\d+(\.\d+)?$/.test(s) ? null : parseInstantMs(s);
  if (format === 'ms' || format === 's') {
    if (!/^-?\d+(\.\d+)?$/.test(s)) return null;
    return Number(s) * (format === 's' ? 1000 : 1);
  }
  if (/^\d+(\.\d+)?$/.test(s)) return Number(s) < 1e11 ? Number(s) * 1000 : Number(s);
  return parseInstantMs(s);
}

function mappedColumns(m: CsvMapping): Array<[string, string]> {
  const cols: Array<[string, string]> = [
    ['mapping.time.column', m.time.column],
    ['mapping.value.column', m.value.column],
  ];
  for (const key of ['service', 'signal', 'kind', 'unit'] as const) {
    const c = m[key]?.column;
    if (c) cols.push([`mapping.${key}.column`, c]);
  }
  for (const [label, c] of Object.entries(m.labels)) cols.push([`mapping.labels.${label}`, c]);
  return cols;
}

export function csvImportService(db: Knex) {
  const ingest = ingestService(db);

  return {
    async preview(stream: AsyncIterable<Buffer>): Promise<CsvPreview> {
      let delimiter = ',';
      const records: string[][] = [];
      for await (const r of readCsv(stream, { onDelimiter: (d) => (delimiter = d) })) {
        records.push(r.fields);
        if (records.length > PREVIEW_ROWS) break;
      }
      if (records.length === 0) throw new ValidationError('The file is empty', 'file');
      const [columns, ...rows] = records as [string[], ...string[][]];
      const guesses: CsvPreview['guesses'] = {};
      const first = rows[0] ?? [];
      const timeIdx = columns.findIndex((c, i) => /time|date|^ts$|timestamp/i.test(c) && first[i] !== undefined && parseTimeCell(first[i]!, 'auto') !== null);
      if (timeIdx >= 0) guesses.time = columns[timeIdx];
      const numeric = columns.filter((c, i) => i !== timeIdx && first[i] !== undefined && first[i]!.trim() !== '' && Number.isFinite(Number(first[i])));
      guesses.value = numeric.find((c) => /value|count|total|amount/i.test(c)) ?? numeric[0];
      return { columns, rows, delimiter, guesses };
    },

    async import(actor: Principal, stream: AsyncIterable<Buffer>, mapping: CsvMapping, fileName: string): Promise<CsvImportResult> {
      const result: CsvImportResult = { rows: 0, imported: 0, duplicates: 0, rejected: 0, errors: [], errorsTruncated: false };
      const report = (e: CsvRowError) => {
        result.rejected++;
        if (result.errors.length < MAX_REPORTED_ERRORS) result.errors.push(e);
        else result.errorsTruncated = true;
      };
      let header: string[] | null = null;
      let index: Record<string, number> = {};
      let batch: IngestPoint[] = [];
      const flush = async () => {
        if (batch.length === 0) return;
        const out = await ingest.write(batch);
        result.imported += out.accepted;
        result.duplicates += out.duplicates;
        for (const r of out.rejected) report({ row: r.index, field: r.field === 't' ? mapping.time.column : (r.field ?? ''), message: r.message });
        batch = [];
      };

      for await (const rec of readCsv(stream)) {
        if (!header) {
          if (rec.error) throw new ValidationError(`The header row is not valid CSV: ${rec.error}`, 'file');
          header = rec.fields.map((c) => c.trim());
          index = Object.fromEntries(header.map((c, i) => [c, i]));
          for (const [field, col] of mappedColumns(mapping)) {
            if (!(col in index)) throw new ValidationError(`${field}: no column named "${col}" in the header (columns: ${header.join(', ')})`, field);
          }
          continue;
        }
        result.rows++;
        const row = rec.record;
        if (rec.error) {
          report({ row, field: '', message: rec.error });
          continue;
        }
        if (rec.fields.length !== header.length) {
          report({ row, field: '', message: `${rec.fields.length} fields where the header has ${header.length} (RFC 4180 §2.4)` });
          continue;
        }
        const cell = (col: string) => rec.fields[index[col]!]!;
        const t = parseTimeCell(cell(mapping.time.column), mapping.time.format);
        if (t === null) {
          report({ row, field: mapping.time.column, message: `"${cell(mapping.time.column)}" is not a time (${mapping.time.format === 'auto' ? 'ISO 8601, seconds or milliseconds' : mapping.time.format})` });
          continue;
        }
        const raw = cell(mapping.value.column).trim();
        const labels: Record<string, string> = {};
        for (const [label, col] of Object.entries(mapping.labels)) {
          const v = cell(col);
          if (v !== '') labels[label] = v;
        }
        const candidate = {
          service: mapping.service.column ? cell(mapping.service.column) : mapping.service.value,
          signal: mapping.signal.column ? cell(mapping.signal.column) : mapping.signal.value,
          kind: mapping.kind.column ? cell(mapping.kind.column).trim().toLowerCase() : mapping.kind.value,
          unit: mapping.unit?.column ? cell(mapping.unit.column) : mapping.unit?.value,
          labels,
          t,
          value: raw === '' ? undefined : Number(raw),
        };
        const parsed = batchPointSchema.safeParse(candidate);
        if (!parsed.success || parsed.data.kind === 'histogram') {
          const issue = parsed.success ? { path: ['kind'], message: 'a CSV row is a counter or a gauge' } : parsed.error.issues[0]!;
          const key = String(issue.path[0] ?? '');
          const column =
            key === 't' ? mapping.time.column : key === 'value' ? mapping.value.column : key === 'labels' ? '' : (mapping[key as 'service' | 'signal' | 'kind' | 'unit']?.column ?? key);
          report({ row, field: column, message: key === 'value' && raw !== '' ? `"${raw}" is not a number` : issue.message });
          continue;
        }
        batch.push(batchPointToIngest(parsed.data, row));
        if (batch.length >= BATCH) await flush();
      }
      if (!header) throw new ValidationError('The file is empty', 'file');
      await flush();
      await auditRepo.record(db, actor, {
        action: 'signals.csv_import',
        subjectType: 'csv',
        subjectId: fileName.slice(0, 200),
        detail: { rows: result.rows, imported: result.imported, duplicates: result.duplicates, rejected: result.rejected },
      });
      return result;
    },
  };
}
