import { useMemo, useState } from 'react';
import { View } from 'react-native';
import type { ReplayResponse } from '../../shared/rules/api-schemas';
import { ValueChart } from '../alerts/value-chart';
import type { StripRow } from '../alerts/state-strip';
import { SelectField } from '../forms/select-field';
import { groupLabel } from '../signals/chart/chart-model';
import { unitLabel } from '../signals/format-value';
import { useTheme } from '../theme';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { Notice } from '../ui/notice';
import { Text } from '../ui/text';

export const REPLAY_PERIODS = [
  { value: '7d', label: 'Last 7 days', ms: 7 * 86_400_000 },
  { value: '1d', label: 'Last 24 hours', ms: 86_400_000 },
  { value: '6h', label: 'Last 6 hours', ms: 6 * 3_600_000 },
] as const;
export type ReplayPeriod = (typeof REPLAY_PERIODS)[number]['value'];

/** "Replay" the draft over a past period: the value, pending/raised spans, and how often it would have raised. */
export function ReplayPanel({
  result,
  threshold,
  busy,
  error,
  onReplay,
}: {
  result: ReplayResponse | undefined;
  threshold: number | null;
  busy: boolean;
  error: string | undefined;
  onReplay: (periodMs: number) => void;
}) {
  const theme = useTheme();
  const [period, setPeriod] = useState<ReplayPeriod>('7d');
  const series = useMemo(() => (result ? result.groups.map((g) => ({ label: groupLabel(g.labels), points: g.points })) : []), [result]);
  const strip: StripRow[] = useMemo(() => (result ? result.groups.map((g) => ({ label: groupLabel(g.labels), spans: g.spans })) : []), [result]);
  const range = useMemo<[number, number]>(() => (result ? [result.from, result.to] : [0, 1]), [result]);
  return (
    <Card
      title="Replay"
      description="Evaluate this draft against history with the evaluator's own logic, before it can page anyone."
      testID="rule-replay-panel"
    >
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-end', gap: theme.space.md }}>
        <View style={{ flexGrow: 1, minWidth: theme.sizes.fieldMin }}>
          <SelectField label="Period" accessibilityLabel="Replay period" value={period} options={REPLAY_PERIODS} onChange={setPeriod} testID="rule-replay-period" />
        </View>
        <Button label="Replay" icon="rewind" onPress={() => onReplay(REPLAY_PERIODS.find((p) => p.value === period)!.ms)} busy={busy} testID="rule-replay" />
      </View>
      {error ? (
        <Notice tone="bad" testID="rule-replay-error">
          {error}
        </Notice>
      ) : null}
      {result ? (
        <View style={{ gap: theme.space.md }} testID="rule-replay-result">
          <Text variant="bodyStrong" testID="rule-replay-count">
            {result.raisedCount === 0
              ? 'Would not have raised in this period'
              : `Would have raised ${result.raisedCount} time${result.raisedCount === 1 ? '' : 's'}`}
          </Text>
          <Text variant="small" tone="muted">
            {`${result.groups.length} group${result.groups.length === 1 ? '' : 's'}, evaluated every ${Math.round(result.stepMs / 1000)} s`}
            {result.samplingIntervalMs ? `; samples arrive every ${Math.round(result.samplingIntervalMs / 1000)} s` : ''}
          </Text>
          {result.warnings.map((w) => (
            <Notice key={w} tone="caution">
              {w}
            </Notice>
          ))}
          <ValueChart series={series} period={range} threshold={threshold} strip={strip} unit={unitLabel(result.unit)} testID="rule-replay-chart" />
        </View>
      ) : null}
    </Card>
  );
}
