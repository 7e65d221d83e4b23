import { useSessionUser } from '../../../hooks/queries/session';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { View } from 'react-native';
import { NotAllowed } from '../../auth/not-allowed';
import { isAdmin } from '../../auth/roles';
import { useTheme } from '../../theme';
import { SettingsPage } from '../settings-page';
import { RetentionForm } from './retention-form';
import { TargetRulesForm } from './target-rules-form';

export function TargetRulesScreen() {
  return (
    <SettingsPage
      title="Target rules"
      description="Which addresses the prober may connect to, checked for every address a target's name resolves to before connecting, and how long runs are kept."
      testID="target-rules-screen"
    >
      <TargetRulesContent />
    </SettingsPage>
  );
}

function TargetRulesContent() {
  const theme = useTheme();
  const user = useSessionUser();
  const { isWide } = useBreakpoints();
  if (!user) return null;
  if (!isAdmin(user)) return <NotAllowed role={user.role} what="Only admins change target rules and retention." />;
  if (isWide) {
    return (
      <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.xl }}>
        <View style={{ flex: 3 }}>
          <TargetRulesForm />
        </View>
        <View style={{ flex: 2 }}>
          <RetentionForm />
        </View>
      </View>
    );
  }
  return (
    <View style={{ gap: theme.space.xl }}>
      <TargetRulesForm />
      <RetentionForm />
    </View>
  );
}
