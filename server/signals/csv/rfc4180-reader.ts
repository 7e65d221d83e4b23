// A streaming CSV reader after RFC 4180 §2 (no CSV package is installed: csv-parse would be the
// usual choice). Text arrives in chunks of any size and complete records come out as soon as
// they end, so an upload is parsed while it is still arriving.
//
// RFC 4180 §2, rule by rule: records end at a line break (1; LF alone is accepted too, as
// spreadsheets on Unix write it); the last record may lack one (2); the header is an ordinary
// record (3); fields are separated by the delimiter and spaces belong to the field (4); an
// unquoted field must not contain a double quote (5); quoted fields may contain line breaks,
// delimiters and quotes (6); a quote inside a quoted field is written twice (7). A record that
// breaks rule 5 or 7, or a quoted field left open at the end, is returned with an error so the
// importer can report it by row and go on.
import { StringDecoder } from 'node:string_decoder';

export interface CsvRecord {
  fields: string[];
  /** 1-based position of the record in the file (the header is record 1). */
  record: number;
  error?: string;
}

type State = 'fieldStart' | 'unquoted' | 'quoted' | 'quoteInQuoted';

export class Rfc4180Reader {
  private state: State = 'fieldStart';
  private field = '';
  private fields: string[] = [];
  private error: string | undefined;
  private skipLf = false;
  private recordNo = 0;
  /** Whether the record in progress has any content (blank lines are skipped). */
  private started = false;
  readonly delimiter: string;

  constructor(opts: { delimiter?: string } = {}) {
    this.delimiter = opts.delimiter ?? ',';
    if (this.delimiter.length !== 1 || /["\r\n]/.test(this.delimiter)) throw new RangeError('the delimiter is one character other than a quote or line break');
  }

  push(text: string): CsvRecord[] {
    const out: CsvRecord[] = [];
    const d = this.delimiter;
    for (let i = 0; i < text.length; i++) {
      const c = text[i]!;
      if (this.skipLf) {
        this.skipLf = false;
        if (c === '\n') continue;
      }
      switch (this.state) {
        case 'fieldStart':
          if (c === '"') {
            this.state = 'quoted';
            this.started = true;
          } else if (c === d) {
            this.fields.push('');
            this.started = true;
          } else if (c === '\r' || c === '\n') this.endRecord(out, c);
          else {
            this.field += c;
            this.state = 'unquoted';
            this.started = true;
          }
          break;
        case 'unquoted':
          if (c === d) this.endField();
          else if (c === '\r' || c === '\n') this.endRecord(out, c);
          else {
            if (c === '"') this.error ??= 'a double quote inside a field that is not enclosed in quotes (RFC 4180 §2.5)';
            this.field += c;
          }
          break;
        case 'quoted':
          if (c === '"') this.state = 'quoteInQuoted';
          else {
            // Runs of ordinary characters are copied in one slice.
            let j = i;
            while (j < text.length && text[j] !== '"') j++;
            this.field += text.slice(i, j);
            i = j - 1;
          }
          break;
        case 'quoteInQuoted':
          if (c === '"') {
            this.field += '"';
            this.state = 'quoted';
          } else if (c === d) this.endField();
          else if (c === '\r' || c === '\n') this.endRecord(out, c);
          else {
            this.error ??= 'text after the closing quote of a field (RFC 4180 §2.7: write a quote inside a quoted field as "")';
            this.field += c;
            this.state = 'unquoted';
          }
          break;
      }
    }
    return out;
  }

  /** Call once at the end of the input: returns the last record if it had no final line break. */
  end(): CsvRecord[] {
    const out: CsvRecord[] = [];
    if (this.state === 'quoted') this.error ??= 'a quoted field is not closed before the end of the file (RFC 4180 §2.6)';
    if (this.started) this.endRecord(out, '');
    return out;
  }

  private endField(): void {
    this.fields.push(this.field);
    this.field = '';
    this.state = 'fieldStart';
  }

  private endRecord(out: CsvRecord[], lineBreak: string): void {
    if (lineBreak === '\r') this.skipLf = true;
    if (!this.started) return; // a blank line
    this.fields.push(this.field);
    this.recordNo++;
    out.push(this.error ? { fields: this.fields, record: this.recordNo, error: this.error } : { fields: this.fields, record: this.recordNo });
    this.fields = [];
    this.field = '';
    this.error = undefined;
    this.state = 'fieldStart';
    this.started = false;
  }
}

/** The delimiter of a sample of the file's start: the candidate that splits the first line most. */
export function detectDelimiter(sample: string): string {
  const firstLine = sample.split(/\r?\n/, 1)[0] ?? '';
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

/**
 * Records of a byte stream (UTF-8; a byte-order mark is dropped), delimiter detected from the
 * first chunk unless given.
 */
export async function* readCsv(stream: AsyncIterable<Buffer | string>, opts: { delimiter?: string; onDelimiter?: (d: string) => void } = {}): AsyncGenerator<CsvRecord, void, void> {
  const decoder = new StringDecoder('utf8');
  let reader: Rfc4180Reader | null = null;
  let pending = '';
  for await (const chunk of stream) {
    let text = typeof chunk === 'string' ? chunk : decoder.write(chunk);
    if (!reader) {
      pending += text;
      // Wait for a whole first line (or enough text) before guessing the delimiter.
      if (!/\n/.test(pending) && pending.length < 64 * 1024) continue;
      if (pending.charCodeAt(0) === 0xfeff) pending = pending.slice(1);
      reader = new Rfc4180Reader({ delimiter: opts.delimiter ?? detectDelimiter(pending) });
      opts.onDelimiter?.(reader.delimiter);
      text = pending;
      pending = '';
    }
    yield* reader.push(text);
  }
  const rest = decoder.end();
  if (!reader) {
    pending += rest;
    if (pending.charCodeAt(0) === 0xfeff) pending = pending.slice(1);
    reader = new Rfc4180Reader({ delimiter: opts.delimiter ?? detectDelimiter(pending) });
    opts.onDelimiter?.(reader.delimiter);
    yield* reader.push(pending);
  } else if (rest) yield* reader.push(rest);
  yield* reader.end();
}
