import { useMemo, useState } from 'react';
import { View } from 'react-native';
import { useJourneyTimingsQuery } from '../../../hooks/queries/journeys';
import { describeError } from '../../format/describe-error';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { EmptyState } from '../../ui/empty-state';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { StatusShape } from '../../ui/status-mark';
import { Text } from '../../ui/text';
import { buildChartData, type ChartData } from './chart-data';
import { TimingChart } from './timing-chart';

const HOURS = 24;

/** Each step's time over the last day, one line per step; failed and void runs marked by shape. */
export function TimingChartCard({ journeyId, vantage }: { journeyId: number; vantage?: string }) {
  const theme = useTheme();
  const timings = useJourneyTimingsQuery(journeyId, HOURS);
  const data = useMemo(() => (timings.data ? buildChartData(timings.data, vantage) : null), [timings.data, vantage]);
  const [width, setWidth] = useState(0);
  return (
    <Card
      title="Step timings, last 24 h"
      description={vantage ? `From ${vantage}. Each line is one step's total time per run.` : "All vantages. Each line is one step's total time per run."}
      testID="journey-timings"
    >
      {timings.isPending ? (
        <Loading label="Loading timings…" />
      ) : timings.isError ? (
        <Notice tone="bad">{describeError(timings.error)}</Notice>
      ) : !data || data.rows.length === 0 ? (
        <EmptyState title="No runs in the last 24 hours" body="Runs appear here once the scheduler has queued the journey and a vantage has run it." />
      ) : (
        <View style={{ gap: theme.space.md }}>
          <View onLayout={(e) => setWidth(Math.floor(e.nativeEvent.layout.width))} style={{ height: theme.sizes.chartHeight }}>
            {width > 0 ? <TimingChart data={data} width={width} height={theme.sizes.chartHeight} /> : null}
          </View>
          <Legend data={data} />
        </View>
      )}
    </Card>
  );
}

function Legend({ data }: { data: ChartData }) {
  const theme = useTheme();
  const c = theme.colors;
  return (
    <View testID="journey-timings-legend" style={{ flexDirection: 'row', flexWrap: 'wrap', columnGap: theme.space.xl, rowGap: theme.space.sm }}>
      {data.series.map((s, i) => (
        <View key={s.key} style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}>
          <View
            style={{
              width: theme.sizes.chartLegendLine,
              borderTopWidth: theme.chart.lineWidth,
              borderStyle: theme.chart.legendStyles[i % theme.chart.legendStyles.length],
              borderColor: c.series[i % c.series.length],
            }}
          />
          <Text variant="small">{`${s.index + 1}. ${s.name}`}</Text>
        </View>
      ))}
      <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}>
        <StatusShape tone="bad" />
        <Text variant="small">
          {'Fail '}
          <Text variant="numberSmall">{data.counts.fail}</Text>
        </Text>
      </View>
      <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}>
        <StatusShape tone="missing" />
        <Text variant="small">
          {'Void, missing data '}
          <Text variant="numberSmall">{data.counts.void}</Text>
        </Text>
      </View>
      <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}>
        <StatusShape tone="good" />
        <Text variant="small">
          {'Pass '}
          <Text variant="numberSmall">{data.counts.pass}</Text>
        </Text>
      </View>
    </View>
  );
}
