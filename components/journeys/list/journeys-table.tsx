import { Link } from 'expo-router';
import { Pressable, View, type ViewStyle } from 'react-native';
import type { JourneySummary } from '../../../shared/schemas/journeys';
import { formatMs } from '../../format/duration';
import { formatPassRate, formatRunCount } from '../../format/pass-rate';
import { describeSchedule } from '../../format/schedule';
import { useTheme } from '../../theme';
import { Text } from '../../ui/text';
import { JOURNEY_COLUMNS } from './journey-columns';
import { LastRun, PausedTag } from './journey-bits';

/** Tablets and wide screens: one row per journey with columns that line up. */
export function JourneysTable({ journeys }: { journeys: JourneySummary[] }) {
  const theme = useTheme();
  const c = theme.colors;
  return (
    <View
      accessibilityRole="list"
      testID="journeys-table"
      style={{ backgroundColor: c.surface, borderColor: c.line, borderWidth: theme.borders.hairline, borderRadius: theme.radii.lg, overflow: 'hidden' }}
    >
      <View
        style={{
          flexDirection: 'row',
          gap: theme.space.lg,
          paddingHorizontal: theme.space.xl,
          paddingVertical: theme.space.md,
          backgroundColor: c.sunken,
          borderBottomWidth: theme.borders.hairline,
          borderBottomColor: c.line,
        }}
      >
        <Header label="Journey" style={JOURNEY_COLUMNS.name} />
        <Header label="Last run" style={JOURNEY_COLUMNS.lastRun} />
        <Header label="Pass rate, 24 h (95 % interval)" style={JOURNEY_COLUMNS.passRate} />
        <Header label="p95 total" style={JOURNEY_COLUMNS.p95} />
        <Header label="Vantages" style={JOURNEY_COLUMNS.vantages} />
      </View>
      {journeys.map((journey, index) => (
        <View key={journey.id} style={index > 0 ? { borderTopWidth: theme.borders.hairline, borderTopColor: c.line } : undefined}>
          <JourneyTableRow journey={journey} />
        </View>
      ))}
    </View>
  );
}

function JourneyTableRow({ journey }: { journey: JourneySummary }) {
  const theme = useTheme();
  return (
    <Link href={`/journeys/${journey.id}`} asChild>
      <Pressable
        testID={`journey-row-${journey.id}`}
        accessibilityRole="link"
        accessibilityLabel={`${journey.name}: open`}
        style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.lg, paddingHorizontal: theme.space.xl, paddingVertical: theme.space.md }}
      >
        <View style={[JOURNEY_COLUMNS.name, { gap: theme.space.xxs }]}>
          <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', columnGap: theme.space.md }}>
            <Text variant="bodyStrong" tone="accent" numberOfLines={1} style={{ flexShrink: 1 }}>
              {journey.name}
            </Text>
            <PausedTag enabled={journey.enabled} />
          </View>
          <Text variant="small" tone="muted" numberOfLines={1}>
            {describeSchedule(journey.schedule)}
          </Text>
        </View>
        <View style={JOURNEY_COLUMNS.lastRun}>
          <LastRun journey={journey} />
        </View>
        <View style={[JOURNEY_COLUMNS.passRate, { gap: theme.space.xxs }]}>
          <Text variant="numberSmall" tone={journey.passRate.rate === null ? 'muted' : 'ink'} testID={`journey-pass-rate-${journey.id}`}>
            {formatPassRate(journey.passRate)}
          </Text>
          <Text variant="caption" tone="faint">
            {formatRunCount(journey.passRate)}
          </Text>
        </View>
        <View style={JOURNEY_COLUMNS.p95}>
          <Text variant="numberSmall">{formatMs(journey.p95TotalMs)}</Text>
        </View>
        <View style={JOURNEY_COLUMNS.vantages}>
          <Text variant="small" numberOfLines={2}>
            {journey.vantages.length ? journey.vantages.join(', ') : 'none chosen'}
          </Text>
        </View>
      </Pressable>
    </Link>
  );
}

function Header({ label, style }: { label: string; style: ViewStyle }) {
  return (
    <View style={style}>
      <Text variant="label" tone="muted">
        {label}
      </Text>
    </View>
  );
}
