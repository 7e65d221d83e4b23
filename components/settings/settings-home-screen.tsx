import { View } from 'react-native';
import { useSessionUser } from '../../hooks/queries/session';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import { ROLE_LABELS } from '../../shared/roles';
import { ROLE_ABILITIES } from '../auth/roles';
import { useTheme } from '../theme';
import { Card } from '../ui/card';
import { Text } from '../ui/text';
import { Screen } from '../ui/screen';
import { SettingsSections } from './settings-sections';

export function SettingsHomeScreen() {
  const theme = useTheme();
  const { isWide } = useBreakpoints();
  return (
    <Screen title={isWide ? 'Your account' : 'Settings'} testID="settings-home">
      <View style={{ gap: theme.space.xl }}>
        <AccountCard />
        {isWide ? null : <SettingsSections pane={false} />}
      </View>
    </Screen>
  );
}

function AccountCard() {
  const theme = useTheme();
  const user = useSessionUser();
  if (!user) return null;
  return (
    <Card title={user.name} testID="settings-account">
      <View style={{ gap: theme.space.md }}>
        <Field label="Email" value={user.email} />
        <Field label="Role" value={ROLE_LABELS[user.role]} />
        <Text variant="small" tone="muted">
          {ROLE_ABILITIES[user.role]}
        </Text>
      </View>
    </Card>
  );
}

function Field({ label, value }: { label: string; value: string }) {
  const theme = useTheme();
  return (
    <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.md }}>
      <Text variant="small" tone="muted" style={{ width: theme.sizes.factLabel }}>
        {label}
      </Text>
      <Text variant="bodyStrong" style={{ flexShrink: 1 }}>
        {value}
      </Text>
    </View>
  );
}
