import { View } from 'react-native';
import { useTheme } from '../../theme';
import { PersonRow } from './person-row';
import type { PeopleViewProps } from './people-table';

/** Phones: one compact block per person. */
export function PeopleList({ people, selfId, viewerRole }: PeopleViewProps) {
  const theme = useTheme();
  const c = theme.colors;
  return (
    <View
      accessibilityRole="list"
      testID="people-list"
      style={{ backgroundColor: c.surface, borderColor: c.line, borderWidth: theme.borders.hairline, borderRadius: theme.radii.lg, paddingHorizontal: theme.space.lg }}
    >
      {people.map((person, index) => (
        <View key={person.id} style={index > 0 ? { borderTopWidth: theme.borders.hairline, borderTopColor: c.line } : undefined}>
          <PersonRow person={person} isSelf={person.id === selfId} viewerRole={viewerRole} layout="card" />
        </View>
      ))}
    </View>
  );
}
