// The fields that differ per rule kind.
import { View } from 'react-native';
import { COMPARISONS } from '../../shared/rules/rule-schema';
import { SelectField } from '../forms/select-field';
import { TextField } from '../forms/text-field';
import { useTheme } from '../theme';
import type { RuleForm } from './rule-form';
import { SignalPicker } from './signal-fields';

export type FormErrors = Partial<Record<keyof RuleForm | 'form', string>>;

interface Props {
  form: RuleForm;
  set: <K extends keyof RuleForm>(key: K, value: RuleForm[K]) => void;
  errors: FormErrors;
}

const OP_OPTIONS = COMPARISONS.map((op) => ({ value: op, label: op }));
const AGGREGATIONS = [
  { value: 'mean', label: 'mean' },
  { value: 'last', label: 'last' },
  { value: 'min', label: 'min' },
  { value: 'max', label: 'max' },
] as const;
const COMBINE = [
  { value: 'mean', label: 'mean of series' },
  { value: 'sum', label: 'sum of series' },
] as const;

/** Fields side by side when there is room, wrapping below the field's minimum width. */
export function FieldRow({ children }: { children: React.ReactNode }) {
  const theme = useTheme();
  return <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.md }}>{children}</View>;
}

function Cell({ children }: { children: React.ReactNode }) {
  const theme = useTheme();
  return <View style={{ flexGrow: 1, flexBasis: theme.sizes.fieldMin, minWidth: theme.sizes.fieldMin }}>{children}</View>;
}

function Comparison({ form, set, errors, unitHint }: Props & { unitHint: string }) {
  return (
    <FieldRow>
      <Cell>
        <SelectField label="Compare" accessibilityLabel="Comparison" value={form.op} options={OP_OPTIONS} onChange={(v) => set('op', v)} error={errors.op} testID="rule-op" />
      </Cell>
      <Cell>
        <TextField label="Threshold" value={form.threshold} onChangeText={(v) => set('threshold', v)} error={errors.threshold} hint={unitHint} keyboardType="numeric" mono testID="rule-threshold" />
      </Cell>
    </FieldRow>
  );
}

export function KindFields(props: Props) {
  const { form, set, errors } = props;
  switch (form.kind) {
    case 'threshold':
      return (
        <>
          <FieldRow>
            <Cell>
              <SelectField label="Over the window, take" accessibilityLabel="Aggregation over the window" value={form.aggregation} options={AGGREGATIONS} onChange={(v) => set('aggregation', v)} testID="rule-aggregation" />
            </Cell>
            <Cell>
              <SelectField label="Series of a group" accessibilityLabel="How series combine" value={form.combine} options={COMBINE} onChange={(v) => set('combine', v)} testID="rule-combine" />
            </Cell>
          </FieldRow>
          <Comparison {...props} unitHint="In the gauge's own unit." />
        </>
      );
    case 'counter_rate':
      return <Comparison {...props} unitHint="Per second, summed over the group's series." />;
    case 'rate_of_change':
      return <Comparison {...props} unitHint="Change of the rate per second (per s²): positive catches a climb, negative a fall." />;
    case 'error_ratio':
      return (
        <>
          <SignalPicker
            service={form.service}
            kind={form.kind}
            kinds={['counter']}
            label="Requests counter"
            value={form.requestsSignal}
            onChange={(v) => set('requestsSignal', v)}
            error={errors.requestsSignal}
            testID="rule-requests-signal"
          />
          <TextField
            label="Requests label filters"
            value={form.requestsFilters}
            onChangeText={(v) => set('requestsFilters', v)}
            error={errors.requestsFilters}
            hint="name=value, separated by commas; empty counts every series."
            mono
            testID="rule-requests-filters"
          />
          <Comparison {...props} unitHint="A share between 0 and 1 (0.05 is 5 %). No requests is “no traffic”, never 0." />
        </>
      );
    case 'latency_quantile':
      return (
        <>
          <TextField label="Quantile" value={form.quantile} onChangeText={(v) => set('quantile', v)} error={errors.quantile} hint="0.99 is p99." keyboardType="numeric" mono testID="rule-quantile" />
          <Comparison {...props} unitHint="In the histogram's unit." />
        </>
      );
    case 'latency_share':
      return (
        <>
          <TextField label="Slow above" value={form.bound} onChangeText={(v) => set('bound', v)} error={errors.bound} hint="Exact when it is one of the bucket bounds." keyboardType="numeric" mono testID="rule-bound" />
          <Comparison {...props} unitHint="Share of observations above the bound, 0 to 1." />
        </>
      );
    case 'time_to_limit':
      return (
        <>
          <FieldRow>
            <Cell>
              <TextField label="Limit" value={form.limit} onChangeText={(v) => set('limit', v)} error={errors.limit} keyboardType="numeric" mono testID="rule-limit" />
            </Cell>
            <Cell>
              <SelectField
                label="Trend goes"
                accessibilityLabel="Direction towards the limit"
                value={form.limitDirection}
                options={[
                  { value: 'above', label: 'up to the limit' },
                  { value: 'below', label: 'down to the limit' },
                ]}
                onChange={(v) => set('limitDirection', v)}
                testID="rule-limit-direction"
              />
            </Cell>
          </FieldRow>
          <TextField label="Within" value={form.horizon} onChangeText={(v) => set('horizon', v)} error={errors.horizon} hint="How far ahead the trend may reach the limit, e.g. 4h." mono testID="rule-horizon" />
        </>
      );
    case 'outlier':
      return (
        <>
          <TextField label="Member label" value={form.memberLabel} onChangeText={(v) => set('memberLabel', v)} error={errors.memberLabel} hint="Each value (e.g. each instance) is compared with its peers." mono testID="rule-member-label" />
          <FieldRow>
            <Cell>
              <TextField label="Modified z-score above" value={form.threshold} onChangeText={(v) => set('threshold', v)} error={errors.threshold} hint="Empty: 3.5 (Iglewicz & Hoaglin)." keyboardType="numeric" mono testID="rule-threshold" />
            </Cell>
            <Cell>
              <SelectField
                label="Direction"
                accessibilityLabel="Outlier direction"
                value={form.outlierDirection}
                options={[
                  { value: 'both', label: 'either side' },
                  { value: 'above', label: 'above peers' },
                  { value: 'below', label: 'below peers' },
                ]}
                onChange={(v) => set('outlierDirection', v)}
                testID="rule-outlier-direction"
              />
            </Cell>
          </FieldRow>
        </>
      );
  }
}
