import { View } from 'react-native';
import type { FieldErrors } from '../../forms/field-errors';
import { Checkbox } from '../../forms/checkbox';
import { FieldMessage } from '../../forms/field-message';
import { SelectField } from '../../forms/select-field';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { Text } from '../../ui/text';
import { Segmented } from '../segmented';
import { usedColumns, type MappingDraft, type Source, type SourcedField } from './csv-draft';

export type MappingField = 'time' | 'value' | 'service' | 'signal' | 'kind' | 'unit' | 'labels';

const TIME_FORMATS = [
  { value: 'auto', label: 'Detect' },
  { value: 'iso', label: 'ISO 8601' },
  { value: 's', label: 'Seconds' },
  { value: 'ms', label: 'Milliseconds' },
] as const;

/** Which column holds what: time and value, where service, signal and kind come from, and labels. */
export function CsvMappingForm({
  columns,
  draft,
  onChange,
  errors,
  twoColumns,
}: {
  /** Wide screens: where values come from on the left, what they are on the right. */
  twoColumns: boolean;
  columns: readonly string[];
  draft: MappingDraft;
  onChange: (draft: MappingDraft) => void;
  errors: FieldErrors<MappingField>;
}) {
  const theme = useTheme();
  const options = columns.map((c) => ({ value: c, label: c }));
  const set = (patch: Partial<MappingDraft>) => onChange({ ...draft, ...patch });
  const used = usedColumns(draft);
  const labelColumns = columns.filter((c) => !used.has(c));
  const timeAndValue = (
    <View style={{ gap: theme.space.lg }}>
      <SelectField label="Time" accessibilityLabel="Time column" value={draft.timeColumn} options={options} onChange={(timeColumn) => set({ timeColumn })} error={errors.time} testID="csv-map-time" />
      <Segmented
        label="Time is written as"
        options={TIME_FORMATS}
        selected={[draft.timeFormat]}
        onSelect={(timeFormat) => set({ timeFormat })}
        testID="csv-map-time-format"
      />
      <SelectField label="Value" accessibilityLabel="Value column" value={draft.valueColumn} options={options} onChange={(valueColumn) => set({ valueColumn })} error={errors.value} testID="csv-map-value" />
      <View style={{ gap: theme.space.xs }}>
        <Text variant="label">Labels</Text>
        {labelColumns.length === 0 ? (
          <Text variant="small" tone="muted">
            Every column is mapped; the samples will have no labels.
          </Text>
        ) : (
          labelColumns.map((c) => (
            <Checkbox
              key={c}
              testID={`csv-map-label-${c.trim()}`}
              label={c}
              detail={`Each row's ${c.trim()} becomes a label`}
              checked={draft.labels.includes(c)}
              onChange={(on) => set({ labels: on ? [...draft.labels, c] : draft.labels.filter((x) => x !== c) })}
            />
          ))
        )}
        <FieldMessage error={errors.labels} />
      </View>
    </View>
  );
  const what = (
    <View style={{ gap: theme.space.lg }}>
      <Sourced name="service" title="Service" placeholder="checkout" columns={options} field={draft.service} onChange={(service) => set({ service })} error={errors.service} />
      <Sourced name="signal" title="Signal" placeholder="http.requests" columns={options} field={draft.signal} onChange={(signal) => set({ signal })} error={errors.signal} />
      <View style={{ gap: theme.space.sm }}>
        <Segmented
          label="Kind"
          options={[
            { value: 'fixed', label: 'Same for every row' },
            { value: 'column', label: 'From a column' },
          ]}
          selected={[draft.kind.source]}
          onSelect={(source: Source) => set({ kind: { ...draft.kind, source } })}
          testID="csv-map-kind-source"
        />
        {draft.kind.source === 'fixed' ? (
          <Segmented
            options={[
              { value: 'gauge', label: 'Gauge' },
              { value: 'counter', label: 'Counter' },
            ]}
            selected={[draft.kind.value]}
            onSelect={(value) => set({ kind: { ...draft.kind, value } })}
            testID="csv-map-kind"
          />
        ) : (
          <SelectField accessibilityLabel="Kind column" value={draft.kind.column} options={options} onChange={(column) => set({ kind: { ...draft.kind, column } })} hint="Its cells say counter or gauge." testID="csv-map-kind-column" />
        )}
        <FieldMessage error={errors.kind} hint={draft.kind.source === 'fixed' ? 'A counter only grows (a drop is a reset); a gauge goes up and down.' : undefined} />
      </View>
      <Sourced name="unit" title="Unit (optional)" noun="Unit" placeholder="ms" columns={options} field={draft.unit} onChange={(unit) => set({ unit })} error={errors.unit} />
    </View>
  );
  if (twoColumns) {
    return (
      <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.xxl }}>
        <View style={{ flex: 1 }}>{timeAndValue}</View>
        <View style={{ flex: 1 }}>{what}</View>
      </View>
    );
  }
  return (
    <View style={{ gap: theme.space.lg }}>
      {timeAndValue}
      {what}
    </View>
  );
}

function Sourced({
  name,
  title,
  noun = title,
  placeholder,
  columns,
  field,
  onChange,
  error,
}: {
  name: string;
  title: string;
  noun?: string;
  placeholder: string;
  columns: { value: string; label: string }[];
  field: SourcedField;
  onChange: (field: SourcedField) => void;
  error?: string;
}) {
  const theme = useTheme();
  return (
    <View style={{ gap: theme.space.sm }}>
      <Segmented
        label={title}
        options={[
          { value: 'fixed', label: 'Same for every row' },
          { value: 'column', label: 'From a column' },
        ]}
        selected={[field.source]}
        onSelect={(source: Source) => onChange({ ...field, source })}
        testID={`csv-map-${name}-source`}
      />
      {field.source === 'fixed' ? (
        <TextField label={`${noun} for every row`} value={field.value} onChangeText={(value) => onChange({ ...field, value })} placeholder={placeholder} error={error} mono autoCapitalize="none" autoComplete="off" testID={`csv-map-${name}`} />
      ) : (
        <SelectField accessibilityLabel={`${title} column`} value={field.column} options={columns} onChange={(column) => onChange({ ...field, column })} error={error} testID={`csv-map-${name}-column`} />
      )}
    </View>
  );
}
