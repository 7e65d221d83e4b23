import { useRouter } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import { useAlertsQuery } from '../../hooks/queries/alerts';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import type { AlertView, AlertsList } from '../../shared/rules/api-schemas';
import { describeError } from '../format/describe-error';
import { useTheme } from '../theme';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { EmptyState } from '../ui/empty-state';
import { Loading } from '../ui/loading';
import { Notice } from '../ui/notice';
import { Screen } from '../ui/screen';
import { Text } from '../ui/text';
import { AlertCard } from './alert-card';
import { AlertDetailView } from './alert-detail';

/** Alerts: raised and pending now first (each with its responder note on top), then history. */
export function AlertsScreen() {
  const router = useRouter();
  return (
    <Screen
      title="Alerts"
      description="Raised and pending now, then what has ended. Each alert starts with what the person paged should check first."
      actions={<Button label="Rules" icon="list" onPress={() => router.push('/alerts/rules')} testID="alerts-rules" />}
      testID="alerts-screen"
    >
      <AlertsContent />
    </Screen>
  );
}

function AlertsContent() {
  const alerts = useAlertsQuery();
  if (alerts.isPending) return <Loading label="Loading alerts…" />;
  if (alerts.isError) return <Notice tone="bad">{describeError(alerts.error)}</Notice>;
  return <AlertsLayout list={alerts.data} />;
}

/** Phone: one column, a tap opens the alert. Wide: the list and the chosen alert side by side. */
function AlertsLayout({ list }: { list: AlertsList }) {
  const theme = useTheme();
  const router = useRouter();
  const { isWide } = useBreakpoints();
  const [chosen, setChosen] = useState<number | null>(null);
  const selected = chosen ?? list.now[0]?.id ?? list.history[0]?.id ?? null;
  const open = (alert: AlertView) => (isWide ? setChosen(alert.id) : router.push(`/alerts/${alert.id}`));
  const lists = (
    <View style={{ gap: theme.space.xl, flex: isWide ? 1 : undefined }}>
      <AlertSection title="Now" alerts={list.now} selected={isWide ? selected : null} onOpen={open} testID="alerts-now" empty="Nothing is raised or pending. Rules keep evaluating every cycle." />
      <AlertSection title="History" alerts={list.history} selected={isWide ? selected : null} onOpen={open} testID="alerts-history" empty="No alert has ended yet." />
    </View>
  );
  if (!isWide) return lists;
  return (
    <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.xl }}>
      <View style={{ width: theme.sizes.editorAsideWidth }}>{lists}</View>
      <View style={{ flex: 1 }} testID="alerts-detail-pane">
        {selected !== null ? (
          <AlertDetailView id={selected} />
        ) : (
          <Card>
            <EmptyState title="No alerts yet" body="When a rule's condition holds, its alert appears here, first as pending, then raised after the sustain time." />
          </Card>
        )}
      </View>
    </View>
  );
}

function AlertSection({
  title,
  alerts,
  selected,
  onOpen,
  testID,
  empty,
}: {
  title: string;
  alerts: AlertView[];
  selected: number | null;
  onOpen: (alert: AlertView) => void;
  testID: string;
  empty: string;
}) {
  const theme = useTheme();
  return (
    <View style={{ gap: theme.space.md }} testID={testID}>
      <View style={{ flexDirection: 'row', alignItems: 'baseline', gap: theme.space.sm }}>
        <Text variant="heading" accessibilityRole="header">
          {title}
        </Text>
        <Text variant="numberSmall" tone="muted">
          {alerts.length}
        </Text>
      </View>
      {alerts.length === 0 ? (
        <Card>
          <EmptyState title={empty} testID={`${testID}-empty`} />
        </Card>
      ) : (
        alerts.map((a) => <AlertCard key={a.id} alert={a} selected={a.id === selected} onPress={() => onOpen(a)} />)
      )}
    </View>
  );
}
