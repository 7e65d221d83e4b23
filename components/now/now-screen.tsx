import { View } from 'react-native';
import { useHealthQuery } from '../../hooks/queries/health';
import { useSessionUser } from '../../hooks/queries/session';
import { useWorkersQuery } from '../../hooks/queries/workers';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import { ROLE_LABELS } from '../../shared/roles';
import { isAdmin } from '../auth/roles';
import { useTheme } from '../theme';
import { Screen } from '../ui/screen';
import { AttentionCard } from './attention-card';
import { FirstStepsCard } from './first-steps-card';
import { SystemCard, systemProblems } from './system-card';

/** Now: what needs a person, how to start, and whether Parallax itself is well. */
export function NowScreen() {
  const user = useSessionUser();
  const description = user ? `Signed in as ${user.name} (${user.email}), ${ROLE_LABELS[user.role]}.` : undefined;
  return (
    <Screen title="Now" description={description} testID="now-screen">
      <NowContent />
    </Screen>
  );
}

function NowContent() {
  const theme = useTheme();
  const { isWide } = useBreakpoints();
  const user = useSessionUser();
  const health = useHealthQuery();
  const workers = useWorkersQuery();
  const admin = isAdmin(user);

  const problems = systemProblems(health.data, health.isError, workers.data);
  const attention = <AttentionCard key="attention" systemProblems={problems} />;
  const steps = <FirstStepsCard key="steps" admin={admin} />;
  const system = <SystemCard key="system" />;

  if (isWide) {
    return (
      <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.xl }}>
        <View style={{ flex: 3, gap: theme.space.xl }}>
          {attention}
          {steps}
        </View>
        <View style={{ flex: 2, gap: theme.space.xl }}>{system}</View>
      </View>
    );
  }

  // One column, most urgent first: a sick server or a silent worker goes to the top.
  return <View style={{ gap: theme.space.lg }}>{problems.length > 0 ? [attention, system, steps] : [attention, steps, system]}</View>;
}
