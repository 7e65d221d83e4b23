import { View } from 'react-native';
import { useSessionUser } from '../../hooks/queries/session';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import { isAdmin } from '../auth/roles';
import { useTheme } from '../theme';
import { Card } from '../ui/card';
import { EmptyState } from '../ui/empty-state';
import { Screen } from '../ui/screen';
import { Text } from '../ui/text';
import { TextLink } from '../ui/text-link';
import { PLACE_INTROS, type PlaceKey, type PlaceIntro } from './place-content';

/** A place that is not built yet: what will live here and what to do first. No made-up data. */
export function PlaceEmptyScreen({ place }: { place: PlaceKey }) {
  const intro: PlaceIntro = PLACE_INTROS[place];
  return (
    <Screen title={intro.title} description={intro.purpose} testID={`place-${place}`}>
      <PlaceEmptyContent intro={intro} />
    </Screen>
  );
}

function PlaceEmptyContent({ intro }: { intro: PlaceIntro }) {
  const theme = useTheme();
  const { isWide } = useBreakpoints();
  const admin = isAdmin(useSessionUser());
  const link = intro.link && (!intro.link.adminOnly || admin) ? intro.link : undefined;
  return (
    <View style={{ flexDirection: isWide ? 'row' : 'column', alignItems: isWide ? 'flex-start' : 'stretch', gap: theme.space.xl }}>
      <Card style={isWide ? { flex: 1 } : undefined}>
        <EmptyState title={intro.emptyTitle} body={intro.emptyBody} />
      </Card>
      <Card title="What to do first" style={isWide ? { flex: 1 } : undefined}>
        <View style={{ gap: theme.space.md }}>
          {intro.firstSteps.map((step, index) => (
            <View key={step} style={{ flexDirection: 'row', gap: theme.space.md }}>
              <Text variant="number" tone="muted" style={{ width: theme.sizes.ordinalColumn }}>
                {index + 1}
              </Text>
              <Text variant="body" style={{ flex: 1 }}>
                {step}
              </Text>
            </View>
          ))}
        </View>
        {link ? <TextLink href={link.href} label={link.label} variant="smallStrong" /> : null}
      </Card>
    </View>
  );
}
