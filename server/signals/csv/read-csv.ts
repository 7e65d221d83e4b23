// Records of an uploaded CSV file, parsed by csv-parse while the upload is still arriving, each with
// its position in the file and, for a record that breaks RFC 4180 §2, the reason (so the importer
// can report it by row and go on with the next one).
//
// csv-parse settings, rule by rule (RFC 4180 §2): records end at CRLF, LF or CR (1; spreadsheets on
// Unix write LF); blank lines are skipped, not counted; rows may have another number of fields than
// the header, which the importer reports itself (4). Quoting errors (5, 7) are parsed with
// relax_quotes: strict csv-parse skips a record with a bad closing quote (`"a"b,c`) but stays inside
// the quoted field, swallowing the following lines up to the next quote; relaxed, it resumes at
// the end of the line. Only a record whose fields hold a double quote can break those rules, so
// only such a record is parsed again strictly to tell whether it does. A quoted field left open at
// the end of the file (6) is skipped by csv-parse and reported in its place.
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { CsvError, parse, type Options } from 'csv-parse';
import { parse as parseStrictly } from 'csv-parse/sync';

export interface CsvRecord {
  fields: string[];
  /** 1-based position of the record in the file (the header is record 1). */
  record: number;
  error?: string;
}

const FIRST_LINE_LIMIT = 64 * 1024;
const RECORD_DELIMITERS = ['\r\n', '\n', '\r'];

/** The delimiter of a sample of the file's start: the candidate that splits the first line most. */
export function detectDelimiter(sample: string): string {
  const firstLine = sample.split(/\r?\n|\r/, 1)[0] ?? '';
  let best = ',';
  let bestCount = 0;
  for (const d of [',', ';', '\t', '|']) {
    const n = firstLine.split(d).length - 1;
    if (n > bestCount) {
      best = d;
      bestCount = n;
    }
  }
  return best;
}

/** csv-parse's errors in the words of RFC 4180 §2. */
function describe(err: unknown): string {
  const code = (err as { code?: string } | undefined)?.code ?? '';
  if (code === 'CSV_INVALID_OPENING_QUOTE' || code === 'INVALID_OPENING_QUOTE') return 'a double quote inside a field that is not enclosed in quotes (RFC 4180 §2.5)';
  if (code === 'CSV_INVALID_CLOSING_QUOTE') return 'text after the closing quote of a field (RFC 4180 §2.7: write a quote inside a quoted field as "")';
  if (code === 'CSV_QUOTE_NOT_CLOSED') return 'a quoted field is not closed before the end of the file (RFC 4180 §2.6)';
  return err instanceof Error ? err.message : String(err);
}

function parserOptions(delimiter: string): Options {
  return { delimiter, record_delimiter: RECORD_DELIMITERS, skip_empty_lines: true, relax_column_count: true };
}

/** Why a relaxed-parsed record breaks RFC 4180 §2.5/§2.7, or undefined when it does not. */
function quotingError(fields: string[], raw: string, delimiter: string): string | undefined {
  if (!fields.some((f) => f.includes('"'))) return undefined;
  try {
    parseStrictly(raw, parserOptions(delimiter));
    return undefined;
  } catch (e) {
    return e instanceof CsvError ? describe(e) : String(e);
  }
}

/**
 * Records of a byte stream (UTF-8; a byte-order mark is dropped), the delimiter detected from the
 * first line unless given. Stopping early leaves the rest of the source unread (not destroyed).
 */
export async function* readCsv(
  stream: AsyncIterable<Buffer | string>,
  opts: { delimiter?: string; onDelimiter?: (d: string) => void } = {},
): AsyncGenerator<CsvRecord, void, void> {
  // A Readable (the upload) is left open when the caller stops early, so the rest of the upload
  // can still be read into nothing and the form completes (csv-upload.ts).
  const source = stream instanceof Readable ? (stream.iterator({ destroyOnReturn: false }) as AsyncIterator<Buffer | string>) : stream[Symbol.asyncIterator]();
  // Enough of the start to see the whole first line, for the delimiter.
  const head: Buffer[] = [];
  let headBytes = 0;
  let sourceDone = false;
  for (;;) {
    const next = await source.next();
    if (next.done) {
      sourceDone = true;
      break;
    }
    const chunk = typeof next.value === 'string' ? Buffer.from(next.value, 'utf8') : next.value;
    head.push(chunk);
    headBytes += chunk.length;
    if (chunk.includes(0x0a) || chunk.includes(0x0d) || headBytes >= FIRST_LINE_LIMIT) break;
  }
  const delimiter = opts.delimiter ?? detectDelimiter(Buffer.concat(head, headBytes).toString('utf8').replace(/^\ufeff/, ''));
  opts.onDelimiter?.(delimiter);

  // Records csv-parse skipped (an unclosed quote), each after how many records it gave. (No
  // on_record hook to count them: csv-parse builds an info object for each call, which tripled
  // the parse time.)
  const skipped: Array<{ after: number; error: string }> = [];
  const parser = parse({
    ...parserOptions(delimiter),
    bom: true,
    relax_quotes: true,
    skip_records_with_error: true,
    raw: true,
    on_skip: (err) => {
      skipped.push({ after: Number((err as { records?: number } | undefined)?.records ?? Infinity), error: describe(err) });
      return undefined;
    },
  });

  async function* chunks() {
    yield* head;
    if (sourceDone) return;
    // Read by hand, not with `for await`, whose early exit would end the source here: the
    // `finally` below does that, after the last read.
    for (let next = await source.next(); !next.done; next = await source.next()) yield next.value;
  }
  const feeding = pipeline(Readable.from(chunks(), { objectMode: false }), parser);
  // A failure of the feed also fails the iteration below; this only keeps it from being unhandled.
  feeding.catch(() => {});

  let record = 0;
  let consumed = 0;
  let s = 0;
  try {
    for await (const r of parser as AsyncIterable<{ record: string[]; raw: string }>) {
      consumed++;
      while (s < skipped.length && skipped[s]!.after < consumed) yield { fields: [], record: ++record, error: skipped[s++]!.error };
      const error = quotingError(r.record, r.raw, delimiter);
      yield error ? { fields: r.record, record: ++record, error } : { fields: r.record, record: ++record };
    }
    await feeding;
    while (s < skipped.length) yield { fields: [], record: ++record, error: skipped[s++]!.error };
  } finally {
    // Stopped early or failed: let go of the source (its listeners; a Readable is not destroyed).
    // Queued behind a read in progress, if any, so it never runs alongside one.
    if (!sourceDone) await source.return?.();
  }
}
