import { View } from 'react-native';
import type { QueryFunction, SignalView } from '../../../shared/schemas/signals';
import { SelectField } from '../../forms/select-field';
import { useTheme } from '../../theme';
import { Text } from '../../ui/text';
import { unitLabel } from '../format-value';
import { DraftField } from './draft-field';
import {
  FUNCTION_HINTS,
  FUNCTION_LABELS,
  FUNCTIONS_BY_KIND,
  QUANTILES,
  RANGES,
  type ExplorerState,
  type QueryFieldErrors,
  type RangeKey,
} from './explorer-params';
import { LabelFilters } from './label-filters';
import { Segmented } from '../segmented';

export type ControlErrors = QueryFieldErrors & { q?: string; denominator?: string };

const SAME = '__same__';
const SERIES = '__series__';
const TOTAL = '__total__';

/** Function, its parameter, grouping, filters, window, step and range for the chosen signal. */
export function QueryControls({
  state,
  signal,
  fn,
  signals,
  seen,
  denominatorSeen,
  errors,
  onChange,
  part,
}: {
  /** all: one block (wide screens); main and detail: above and below the chart (phones). */
  part: 'all' | 'main' | 'detail';
  state: ExplorerState;
  signal: SignalView;
  fn: QueryFunction;
  signals: readonly SignalView[];
  seen: Record<string, readonly string[]>;
  denominatorSeen: Record<string, readonly string[]>;
  errors: ControlErrors;
  onChange: (patch: Partial<ExplorerState>) => void;
}) {
  const theme = useTheme();
  const unit = unitLabel(signal.unit);
  const denominator = signals.find((s) => s.name === (state.denominator ?? signal.name)) ?? signal;

  const groupOptions = [
    ...(fn === 'ratio' ? [] : [{ value: SERIES, label: 'Each series' }]),
    { value: TOTAL, label: 'Total' },
    ...signal.labelKeys.map((k) => ({ value: k, label: k })),
  ];
  const groupSelected = fn !== 'ratio' && state.by === null ? [SERIES] : !state.by || state.by.length === 0 ? [TOTAL] : state.by;
  const chooseGroup = (value: string) => {
    if (value === SERIES) onChange({ by: null });
    else if (value === TOTAL) onChange({ by: [] });
    else {
      const current = state.by ?? [];
      const next = current.includes(value) ? current.filter((k) => k !== value) : [...current, value];
      onChange({ by: next });
    }
  };

  const functionRow = (
    <View style={{ gap: theme.space.xs }}>
      <Segmented
        label="Function"
        options={FUNCTIONS_BY_KIND[signal.kind].map((f) => ({ value: f, label: FUNCTION_LABELS[f] }))}
        selected={[fn]}
        onSelect={(f) => onChange({ fn: f })}
        testID="explorer-fn"
      />
      <Text variant="small" tone="muted">
        {FUNCTION_HINTS[fn]}
      </Text>
    </View>
  );

  const parameter =
    fn === 'quantile' ? (
      <Segmented
        label="Quantile"
        options={QUANTILES.map((q) => ({ value: String(q), label: `p${Math.round(q * 100)}` }))}
        selected={[String(state.q)]}
        onSelect={(q) => onChange({ q: Number(q) })}
        testID="explorer-q"
      />
    ) : fn === 'share_above' ? (
      <DraftField
        label={`Above${unit ? ` (${unit})` : ''}`}
        hint="A bucket bound of the histogram gives an exact share; between bounds it is interpolated."
        value={state.bound}
        onCommit={(bound) => onChange({ bound })}
        error={errors.bound}
        testID="explorer-bound"
      />
    ) : fn === 'trend' ? (
      <DraftField
        label={`Limit (optional${unit ? `, ${unit}` : ''})`}
        hint="The level whose crossing time is forecast from the current slope."
        value={state.limit}
        onCommit={(limit) => onChange({ limit })}
        error={errors.limit}
        testID="explorer-limit"
      />
    ) : null;

  // A ratio's denominator reads after the numerator's filters: "these, divided by those".
  const denominatorBlock =
    fn === 'ratio' ? (
      <View style={{ gap: theme.space.md, maxWidth: theme.sizes.formMax * 1.5 }}>
        <SelectField
          label="Divided by"
          accessibilityLabel="Denominator signal"
          value={state.denominator ?? SAME}
          options={[
            { value: SAME, label: `${signal.name} (this signal, other filters)` },
            ...signals.filter((s) => s.kind === 'counter' && s.name !== signal.name).map((s) => ({ value: s.name, label: s.name })),
          ]}
          onChange={(v) => onChange({ denominator: v === SAME ? null : v, denominatorFilters: {} })}
          error={errors.denominator}
          hint="For an error ratio: errors above (filtered to failures), all requests here."
          testID="explorer-denominator"
        />
        <LabelFilters
          title="Denominator filters"
          labelKeys={denominator.labelKeys}
          seen={denominatorSeen}
          filters={state.denominatorFilters}
          onChange={(denominatorFilters) => onChange({ denominatorFilters })}
          testID="explorer-den-filter"
        />
      </View>
    ) : null;

  const grouping =
    fn === 'raw' ? (
      <Text variant="small" tone="muted">
        Raw samples are drawn one line per series.
      </Text>
    ) : (
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-end', gap: theme.space.lg }}>
        <Segmented label="Group by" options={groupOptions} selected={groupSelected} onSelect={chooseGroup} testID="explorer-by" />
        {state.by !== null && fn !== 'ratio' ? (
          <Segmented
            label="Combine with"
            options={[
              { value: 'sum', label: 'Sum' },
              { value: 'mean', label: 'Mean' },
            ]}
            selected={[state.agg]}
            onSelect={(agg) => onChange({ agg })}
            testID="explorer-agg"
          />
        ) : null}
      </View>
    );

  const range = (
    <Segmented
      label="Range"
      options={RANGES.map((r) => ({ value: r.key, label: r.label }))}
      selected={[state.range]}
      onSelect={(range: RangeKey) => onChange({ range })}
      testID="explorer-range"
    />
  );

  const windowStep =
    fn === 'raw' ? null : (
      <View style={{ flexDirection: 'row', gap: theme.space.md, flexGrow: 1, flexBasis: theme.sizes.formMax / 1.5, maxWidth: theme.sizes.formMax }}>
        <View style={{ flex: 1 }}>
          <DraftField label="Window" value={state.window} onCommit={(window) => onChange({ window })} error={errors.window} testID="explorer-window" />
        </View>
        <View style={{ flex: 1 }}>
          <DraftField
            label="Step"
            value={state.step ?? ''}
            placeholder="auto"
            onCommit={(step) => onChange({ step: step.trim() === '' ? null : step.trim() })}
            error={errors.step}
            testID="explorer-step"
          />
        </View>
      </View>
    );

  const filters = (
    <LabelFilters title={fn === 'ratio' ? 'Numerator filters' : 'Filters'} labelKeys={signal.labelKeys} seen={seen} filters={state.filters} onChange={(filters) => onChange({ filters })} testID="explorer-filter" />
  );

  const row = { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-start', columnGap: theme.space.xl, rowGap: theme.space.lg } as const;
  // Phones: what is changed most (function, range) sits above the chart, the rest below it.
  if (part === 'main') {
    return (
      <View testID="explorer-controls" style={{ gap: theme.space.lg }}>
        {functionRow}
        {parameter}
        {range}
      </View>
    );
  }
  if (part === 'detail') {
    return (
      <View testID="explorer-more-controls" style={{ gap: theme.space.lg }}>
        {grouping}
        {filters}
        {denominatorBlock}
        {windowStep}
      </View>
    );
  }
  return (
    <View testID="explorer-controls" style={{ gap: theme.space.lg }}>
      <View style={row}>
        <View style={{ flexGrow: 1, flexBasis: theme.sizes.formMax, flexShrink: 1 }}>{functionRow}</View>
        {range}
      </View>
      {parameter}
      <View style={row}>
        {grouping}
        {windowStep}
      </View>
      {filters}
      {denominatorBlock}
    </View>
  );
}
