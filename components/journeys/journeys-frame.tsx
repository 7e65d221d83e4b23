import { Slot, usePathname } from 'expo-router';
import { ScrollView, View } from 'react-native';
import { useJourneysQuery } from '../../hooks/queries/journeys';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import { useTheme } from '../theme';
import { Loading } from '../ui/loading';
import { Text } from '../ui/text';
import { TextLink } from '../ui/text-link';
import { JourneysList } from './list/journeys-list';

const DETAIL_PATH = /^\/journeys\/(\d+)(\/runs\/\d+)?\/?$/;

/**
 * Roomy wide screens: a journey's detail and its runs sit beside the list of journeys (two panes).
 * The list itself, the editor and HAR import use the whole width; phones show one page at a time.
 */
export function JourneysFrame() {
  const theme = useTheme();
  const { isRoomy } = useBreakpoints();
  const match = DETAIL_PATH.exec(usePathname());
  if (!isRoomy || !match) return <Slot />;
  return (
    <View style={{ flex: 1, flexDirection: 'row', backgroundColor: theme.colors.paper }}>
      <JourneyPane selectedId={Number(match[1])} />
      <View style={{ flex: 1 }}>
        <Slot />
      </View>
    </View>
  );
}

function JourneyPane({ selectedId }: { selectedId: number }) {
  const theme = useTheme();
  const journeys = useJourneysQuery();
  return (
    <View
      testID="journeys-pane"
      style={{ width: theme.sizes.journeyPaneWidth, borderRightWidth: theme.borders.hairline, borderRightColor: theme.colors.line }}
    >
      <ScrollView contentContainerStyle={{ paddingHorizontal: theme.space.md, paddingTop: theme.space.xxl + theme.space.sm, paddingBottom: theme.space.xl, gap: theme.space.lg }}>
        <View style={{ paddingHorizontal: theme.space.md, flexDirection: 'row', justifyContent: 'space-between', alignItems: 'baseline' }}>
          <Text variant="label" tone="muted">
            Journeys
          </Text>
          <TextLink href="/journeys" label="All" variant="smallStrong" testID="journeys-pane-all" />
        </View>
        {journeys.data ? <JourneysList journeys={journeys.data} selectedId={selectedId} dense /> : <Loading label="Loading…" />}
      </ScrollView>
    </View>
  );
}
