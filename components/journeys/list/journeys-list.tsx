import { Link } from 'expo-router';
import { Pressable, View } from 'react-native';
import type { JourneySummary } from '../../../shared/schemas/journeys';
import { formatMs } from '../../format/duration';
import { formatPassRate } from '../../format/pass-rate';
import { describeSchedule } from '../../format/schedule';
import { useTheme } from '../../theme';
import { Icon } from '../../ui/icon';
import { Text } from '../../ui/text';
import { LastRun, PausedTag } from './journey-bits';

/**
 * Phones (and the pane beside a journey on wide screens): one compact block per journey, the
 * verdict first. `selectedId` marks the journey open beside the list.
 */
export function JourneysList({ journeys, selectedId, dense = false }: { journeys: JourneySummary[]; selectedId?: number; dense?: boolean }) {
  const theme = useTheme();
  const c = theme.colors;
  return (
    <View
      accessibilityRole="list"
      testID={dense ? 'journeys-pane-list' : 'journeys-list'}
      style={
        dense
          ? { gap: theme.space.xxs }
          : { backgroundColor: c.surface, borderColor: c.line, borderWidth: theme.borders.hairline, borderRadius: theme.radii.lg, overflow: 'hidden' }
      }
    >
      {journeys.map((journey, index) => (
        <View key={journey.id} style={index > 0 && !dense ? { borderTopWidth: theme.borders.hairline, borderTopColor: c.line } : undefined}>
          <JourneyListItem journey={journey} selected={journey.id === selectedId} dense={dense} />
        </View>
      ))}
    </View>
  );
}

function JourneyListItem({ journey, selected, dense }: { journey: JourneySummary; selected: boolean; dense: boolean }) {
  const theme = useTheme();
  const c = theme.colors;
  return (
    <Link href={`/journeys/${journey.id}`} asChild>
      <Pressable
        testID={dense ? `journey-pane-row-${journey.id}` : `journey-row-${journey.id}`}
        accessibilityRole="link"
        accessibilityState={{ selected }}
        accessibilityLabel={`${journey.name}: open`}
        style={{
          flexDirection: 'row',
          alignItems: 'center',
          gap: theme.space.md,
          minHeight: theme.sizes.touchTarget,
          paddingHorizontal: dense ? theme.space.md : theme.space.lg,
          paddingVertical: dense ? theme.space.sm : theme.space.md,
          borderRadius: dense ? theme.radii.md : 0,
          backgroundColor: selected ? c.accentWash : 'transparent',
        }}
      >
        <View style={{ flex: 1, gap: theme.space.xs }}>
          <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', columnGap: theme.space.md, rowGap: theme.space.xxs }}>
            <Text variant={dense ? 'smallStrong' : 'bodyStrong'} tone={selected ? 'accent' : 'ink'} numberOfLines={1} style={{ flexShrink: 1 }}>
              {journey.name}
            </Text>
            <PausedTag enabled={journey.enabled} />
          </View>
          <LastRun journey={journey} compact />
          <Text variant="caption" tone="muted" numberOfLines={1}>
            <Text variant="caption" style={{ fontFamily: theme.fonts.mono }} tone="muted">
              {formatPassRate(journey.passRate)}
            </Text>
            {dense ? null : ` · p95 `}
            {dense ? null : (
              <Text variant="caption" style={{ fontFamily: theme.fonts.mono }} tone="muted">
                {formatMs(journey.p95TotalMs)}
              </Text>
            )}
          </Text>
          {dense ? null : (
            <Text variant="caption" tone="faint" numberOfLines={1}>
              {`${describeSchedule(journey.schedule)} · ${journey.vantages.length ? journey.vantages.join(', ') : 'no vantage chosen'}`}
            </Text>
          )}
        </View>
        {dense ? null : <Icon name="chevron-right" size={theme.sizes.icon} color={c.inkFaint} />}
      </Pressable>
    </Link>
  );
}
