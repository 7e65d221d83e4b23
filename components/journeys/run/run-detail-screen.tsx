import type { ReactNode } from 'react';
import { View } from 'react-native';
import { isApiError } from '../../../hooks/api-client';
import type { RunDetail } from '../../../hooks/queries/journey-views';
import { useJourneyQuery } from '../../../hooks/queries/journeys';
import { useRunQuery } from '../../../hooks/queries/runs';
import { describeError } from '../../format/describe-error';
import { formatMs } from '../../format/duration';
import { formatSlot } from '../../format/time';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { Screen } from '../../ui/screen';
import { Text } from '../../ui/text';
import { TextLink } from '../../ui/text-link';
import { VERDICT_MEANINGS, VerdictMark } from '../verdict-mark';
import { RunResultView } from './run-result-view';

export function RunDetailScreen({ journeyId, runId }: { journeyId: number; runId: number }) {
  const journey = useJourneyQuery(journeyId);
  const name = journey.data?.name ?? 'journey';
  return (
    <Screen
      title={`Run ${runId}`}
      description={journey.data ? `One run of ${journey.data.name}.` : undefined}
      before={<TextLink href={`/journeys/${journeyId}`} label={`‹ ${name}`} variant="smallStrong" testID="run-back" />}
      testID="run-detail"
    >
      <RunDetailContent runId={runId} journeyId={journeyId} />
    </Screen>
  );
}

function RunDetailContent({ runId, journeyId }: { runId: number; journeyId: number }) {
  const theme = useTheme();
  const run = useRunQuery(runId);
  if (run.isPending) return <Loading label="Loading the run…" />;
  if (run.isError) {
    return (
      <Notice tone="bad" title={isApiError(run.error) && run.error.status === 404 ? 'No such run (it may be past its retention)' : 'Could not load the run'}>
        {describeError(run.error)}
      </Notice>
    );
  }
  if (run.data.journeyId !== journeyId) {
    return <Notice tone="caution" title="This run belongs to another journey">{`Run ${runId} is a run of journey ${run.data.journeyId}.`}</Notice>;
  }
  return (
    <View style={{ gap: theme.space.xl }}>
      <RunFacts run={run.data} />
      <RunResultView result={run.data} testID="run-result" />
    </View>
  );
}

function RunFacts({ run }: { run: RunDetail }) {
  const theme = useTheme();
  return (
    <Card testID="run-facts">
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: theme.space.md }}>
        <VerdictMark verdict={run.verdict} chip testID="run-verdict" />
        <Text variant="small" tone="muted">
          {VERDICT_MEANINGS[run.verdict]}
        </Text>
      </View>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', columnGap: theme.space.xxl, rowGap: theme.space.md }}>
        <Fact label="Slot">{formatSlot(run.slotAt)}</Fact>
        <Fact label="Vantage" mono={false}>
          {run.vantage}
        </Fact>
        <Fact label="Version">{String(run.version)}</Fact>
        <Fact label="Duration">{formatMs(run.durationMs)}</Fact>
        <Fact label="Started late by">{formatMs(run.latenessMs)}</Fact>
        <Fact label="Trigger" mono={false}>
          {run.trigger === 'missed' ? 'missed slot (recorded after an outage)' : 'schedule'}
        </Fact>
      </View>
    </Card>
  );
}

function Fact({ label, children, mono = true }: { label: string; children: ReactNode; mono?: boolean }) {
  const theme = useTheme();
  return (
    <View style={{ gap: theme.space.xxs }}>
      <Text variant="caption" tone="muted">
        {label}
      </Text>
      <Text variant={mono ? 'numberSmall' : 'smallStrong'}>{children}</Text>
    </View>
  );
}
