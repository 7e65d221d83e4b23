import { View, type ViewStyle } from 'react-native';
import type { Role } from '../../../shared/roles';
import type { UserView } from '../../../shared/schemas/users';
import { useTheme } from '../../theme';
import { Text } from '../../ui/text';
import { PEOPLE_COLUMNS } from './people-columns';
import { PersonRow } from './person-row';

export interface PeopleViewProps {
  people: UserView[];
  selfId: number;
  viewerRole: Role;
}

/** Tablets and wide screens: one row per person with columns that line up. */
export function PeopleTable({ people, selfId, viewerRole }: PeopleViewProps) {
  const theme = useTheme();
  const c = theme.colors;
  return (
    <View
      accessibilityRole="list"
      testID="people-table"
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
        <Header label="Person" style={PEOPLE_COLUMNS.person} />
        <Header label="Role" style={PEOPLE_COLUMNS.role} />
        <Header label="Status" style={PEOPLE_COLUMNS.status} />
        <Header label="Last signed in" style={PEOPLE_COLUMNS.lastSignIn} />
        <Header label="" style={PEOPLE_COLUMNS.actions} />
      </View>
      {people.map((person, index) => (
        <View key={person.id} style={index > 0 ? { borderTopWidth: theme.borders.hairline, borderTopColor: c.line } : undefined}>
          <PersonRow person={person} isSelf={person.id === selfId} viewerRole={viewerRole} layout="table" />
        </View>
      ))}
    </View>
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
