import { useSessionUser } from '../../../hooks/queries/session';
import { useUsersQuery } from '../../../hooks/queries/users';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { View } from 'react-native';
import { isAdmin } from '../../auth/roles';
import { NotAllowed } from '../../auth/not-allowed';
import { describeError } from '../../format/describe-error';
import { useTheme } from '../../theme';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { SettingsPage } from '../settings-page';
import { AddPersonForm } from './add-person-form';
import { PeopleList } from './people-list';
import { PeopleTable } from './people-table';

export function PeopleScreen() {
  return (
    <SettingsPage title="People" description="Everyone who can sign in, and the role that decides what they may change." testID="people-screen">
      <PeopleContent />
    </SettingsPage>
  );
}

function PeopleContent() {
  const theme = useTheme();
  const user = useSessionUser();
  const admin = isAdmin(user);
  const { atLeastTablet } = useBreakpoints();
  const people = useUsersQuery({ enabled: admin });

  if (!user) return null;
  if (!admin) return <NotAllowed role={user.role} what="Only admins see and manage people." />;

  return (
    <View style={{ gap: theme.space.xl }}>
      {people.isPending ? (
        <Loading label="Loading people…" />
      ) : people.isError ? (
        <Notice tone="bad" title="Could not load people">
          {describeError(people.error, user.role)}
        </Notice>
      ) : atLeastTablet ? (
        <PeopleTable people={people.data} selfId={user.id} viewerRole={user.role} />
      ) : (
        <PeopleList people={people.data} selfId={user.id} viewerRole={user.role} />
      )}
      <AddPersonForm viewerRole={user.role} />
    </View>
  );
}
