import { router } from 'expo-router';
import { View } from 'react-native';
import { useJourneysQuery } from '../../../hooks/queries/journeys';
import { useSessionUser } from '../../../hooks/queries/session';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { canWriteJourneys } from '../../auth/roles';
import { describeError } from '../../format/describe-error';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { EmptyState } from '../../ui/empty-state';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { Screen } from '../../ui/screen';
import { JourneysList } from './journeys-list';
import { JourneysTable } from './journeys-table';

export function JourneysScreen() {
  const writer = canWriteJourneys(useSessionUser());
  return (
    <Screen
      title="Journeys"
      description="Scripted walks through your service the way a customer uses it, run on a schedule from each vantage. Pass rates cover the last 24 hours; void runs are missing data and do not count."
      actions={writer ? <JourneyActions /> : undefined}
      testID="journeys-screen"
    >
      <JourneysContent writer={writer} />
    </Screen>
  );
}

function JourneyActions() {
  const theme = useTheme();
  return (
    <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.sm }}>
      <Button label="New journey" kind="primary" icon="plus" onPress={() => router.push('/journeys/new')} testID="journeys-new" />
      <Button label="Import HAR" icon="upload" onPress={() => router.push('/journeys/import')} testID="journeys-import" />
    </View>
  );
}

function JourneysContent({ writer }: { writer: boolean }) {
  const { atLeastTablet } = useBreakpoints();
  const user = useSessionUser();
  const journeys = useJourneysQuery();
  if (journeys.isPending) return <Loading label="Loading journeys…" />;
  if (journeys.isError) {
    return (
      <Notice tone="bad" title="Could not load journeys">
        {describeError(journeys.error, user?.role)}
      </Notice>
    );
  }
  if (journeys.data.length === 0) {
    return (
      <Card testID="journeys-empty">
        <EmptyState
          title="No journeys yet"
          body={
            writer
              ? 'Write the first one step by step, or import a HAR file recorded in your browser. Start with the path customers depend on most.'
              : 'Engineers and admins write journeys. Runs, verdicts and step timings show up here once they do.'
          }
        />
      </Card>
    );
  }
  // Most urgent first: failing journeys, then void (missing data), then the rest by name.
  const rank = { fail: 0, void: 1, pass: 2 } as const;
  const ordered = [...journeys.data].sort(
    (a, b) => (a.lastRun ? rank[a.lastRun.verdict] : 3) - (b.lastRun ? rank[b.lastRun.verdict] : 3) || a.name.localeCompare(b.name),
  );
  return atLeastTablet ? <JourneysTable journeys={ordered} /> : <JourneysList journeys={ordered} />;
}
