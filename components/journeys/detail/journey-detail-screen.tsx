import { router } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import { isApiError } from '../../../hooks/api-client';
import { useJourneyQuery } from '../../../hooks/queries/journeys';
import { useSessionUser } from '../../../hooks/queries/session';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { canWriteJourneys } from '../../auth/roles';
import { describeError } from '../../format/describe-error';
import { describeSchedule } from '../../format/schedule';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { Screen } from '../../ui/screen';
import { StatusMark } from '../../ui/status-mark';
import { TextLink } from '../../ui/text-link';
import { TimingChartCard } from '../timing-chart/timing-chart-card';
import type { JourneyDetail } from '../../../hooks/queries/journey-views';
import { RunHistory, type RunFilters } from './run-history';
import { StepsSummary } from './steps-summary';
import { VantageStates } from './vantage-states';

export function JourneyDetailScreen({ id }: { id: number }) {
  const { isRoomy } = useBreakpoints();
  const writer = canWriteJourneys(useSessionUser());
  const [version, setVersion] = useState<number | undefined>(undefined);
  const journey = useJourneyQuery(id, version);
  const j = journey.data;
  // With the list of journeys beside it, a link back to the list would repeat it.
  const back = isRoomy ? undefined : <TextLink href="/journeys" label="‹ Journeys" variant="smallStrong" testID="journey-back" />;
  return (
    <Screen
      title={j?.name ?? 'Journey'}
      description={j ? headline(j) : undefined}
      before={back}
      actions={
        writer && j ? <Button label="Edit" icon="edit-2" onPress={() => router.push(`/journeys/${id}/edit`)} testID="journey-edit" /> : undefined
      }
      testID="journey-detail"
    >
      {journey.isPending ? (
        <Loading label="Loading the journey…" />
      ) : journey.isError ? (
        <Notice tone="bad" title={isApiError(journey.error) && journey.error.status === 404 ? 'No such journey' : 'Could not load the journey'}>
          {describeError(journey.error)}
        </Notice>
      ) : (
        <JourneyDetailContent journey={journey.data} onVersion={setVersion} />
      )}
    </Screen>
  );
}

function headline(j: JourneyDetail): string {
  const vantages = j.document.vantages.join(', ');
  return `Runs ${describeSchedule(j.document.schedule)} from ${vantages}. Version ${j.version}.`;
}

function JourneyDetailContent({ journey, onVersion }: { journey: JourneyDetail; onVersion: (v: number | undefined) => void }) {
  const theme = useTheme();
  const { isWide } = useBreakpoints();
  const [filters, setFilters] = useState<RunFilters>({ verdict: 'all', vantage: 'all' });
  const current = journey.versions[0]?.version ?? journey.version;
  const ranFrom = [...new Set([...journey.document.vantages, ...journey.vantageStates.map((s) => s.vantage)])];
  const chartVantage = filters.vantage === 'all' ? undefined : filters.vantage;

  const notices = (
    <>
      {!journey.enabled ? (
        <View style={{ flexDirection: 'row' }}>
          <StatusMark tone="off" label="Paused: the scheduler skips this journey until it is enabled again" chip />
        </View>
      ) : null}
      {journey.version !== current ? (
        <Notice tone="info" title={`Showing version ${journey.version}`}>
          {`The current version is ${current}; runs and timings cover every version.`}
        </Notice>
      ) : null}
    </>
  );
  const vantages = <VantageStates vantages={journey.document.vantages} states={journey.vantageStates} quorum={journey.document.failureQuorum} />;
  const steps = <StepsSummary journey={journey} onVersion={onVersion} />;
  const chart = <TimingChartCard journeyId={journey.id} vantage={chartVantage} />;
  const history = <RunHistory journeyId={journey.id} vantages={ranFrom} filters={filters} onFilters={setFilters} />;

  if (isWide) {
    return (
      <View style={{ gap: theme.space.xl }}>
        {notices}
        {chart}
        <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.xl }}>
          <View style={{ flex: 1 }}>{vantages}</View>
          <View style={{ flex: 1 }}>{steps}</View>
        </View>
        {history}
      </View>
    );
  }
  return (
    <View style={{ gap: theme.space.lg }}>
      {notices}
      {vantages}
      {chart}
      {history}
      {steps}
    </View>
  );
}
