// The column-mapping form's state, its first guess from the preview, and the mapping it sends.
import type { CsvMapping, CsvPreview } from '../../../shared/schemas/signals';

export type Source = 'fixed' | 'column';

export interface SourcedField {
  source: Source;
  column: string;
  value: string;
}

export interface MappingDraft {
  timeColumn: string;
  timeFormat: CsvMapping['time']['format'];
  valueColumn: string;
  service: SourcedField;
  signal: SourcedField;
  kind: SourcedField;
  unit: SourcedField;
  /** Columns whose values become labels (the label is named after the column). */
  labels: string[];
}

function sourced(columns: string[], pattern: RegExp, fallback: string, taken: Set<string>): SourcedField {
  const column = columns.find((c) => pattern.test(c.trim()) && !taken.has(c));
  if (column) taken.add(column);
  return column ? { source: 'column', column, value: fallback } : { source: 'fixed', column: columns[0] ?? '', value: fallback };
}

export function initialDraft(preview: CsvPreview): MappingDraft {
  const columns = preview.columns;
  const timeColumn = preview.guesses.time ?? columns[0] ?? '';
  const valueColumn = preview.guesses.value ?? columns.find((c) => c !== timeColumn) ?? '';
  const taken = new Set([timeColumn, valueColumn]);
  const service = sourced(columns, /^(service|service[._ ]name)$/i, '', taken);
  const signal = sourced(columns, /^(signal|metric|metric[._ ]name|name)$/i, '', taken);
  const kind = sourced(columns, /^(kind|type)$/i, 'gauge', taken);
  const unit = sourced(columns, /^units?$/i, '', taken);
  return {
    timeColumn,
    timeFormat: 'auto',
    valueColumn,
    service,
    signal,
    kind,
    unit,
    labels: columns.filter((c) => !taken.has(c)),
  };
}

/** Columns already used for something other than a label. */
export function usedColumns(d: MappingDraft): Set<string> {
  const used = new Set([d.timeColumn, d.valueColumn]);
  for (const f of [d.service, d.signal, d.kind, d.unit]) if (f.source === 'column') used.add(f.column);
  return used;
}

// The import reads the header with its cells trimmed; the preview shows them as written.
function pick(f: SourcedField): { column?: string; value?: string } {
  return f.source === 'column' ? { column: f.column.trim() } : { value: f.value.trim() === '' ? undefined : f.value.trim() };
}

/** What the API's mapping schema reads (validated with the same schema before sending). */
export function draftToMapping(d: MappingDraft): unknown {
  const used = usedColumns(d);
  const unit = pick(d.unit);
  return {
    time: { column: d.timeColumn.trim(), format: d.timeFormat },
    value: { column: d.valueColumn.trim() },
    service: pick(d.service),
    signal: pick(d.signal),
    kind: d.kind.source === 'column' ? { column: d.kind.column.trim() } : { value: d.kind.value },
    unit: unit.column || unit.value ? unit : undefined,
    labels: Object.fromEntries(d.labels.filter((c) => !used.has(c)).map((c) => [c.trim(), c.trim()])),
  };
}
