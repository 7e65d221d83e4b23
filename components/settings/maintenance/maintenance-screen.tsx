import { View } from 'react-native';
import { useDeleteMaintenanceWindowMutation, useMaintenanceWindowsQuery } from '../../../hooks/queries/maintenance';
import { useSessionUser } from '../../../hooks/queries/session';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import type { MaintenanceWindowView } from '../../../shared/rules/api-schemas';
import { describeError } from '../../format/describe-error';
import { formatDateTime } from '../../format/time';
import { canWriteRules } from '../../rules/can-write-rules';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { EmptyState } from '../../ui/empty-state';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { StatusMark } from '../../ui/status-mark';
import { Text } from '../../ui/text';
import { SettingsPage } from '../settings-page';
import { MaintenanceWindowForm } from './window-form';

export function MaintenanceScreen() {
  return (
    <SettingsPage
      title="Maintenance windows"
      description="Planned periods per service: alerts still evaluate and are recorded, marked planned, and nobody is paged."
      testID="maintenance-screen"
    >
      <MaintenanceContent />
    </SettingsPage>
  );
}

function MaintenanceContent() {
  const theme = useTheme();
  const { isWide } = useBreakpoints();
  const writer = canWriteRules(useSessionUser());
  const windows = useMaintenanceWindowsQuery();
  const list = windows.isPending ? (
    <Loading label="Loading windows…" />
  ) : windows.isError ? (
    <Notice tone="bad">{describeError(windows.error)}</Notice>
  ) : windows.data.length === 0 ? (
    <Card>
      <EmptyState testID="maintenance-empty" title="No maintenance windows" body="Plan one before a deploy or migration so its alerts are recorded without paging anyone." />
    </Card>
  ) : (
    <View style={{ gap: theme.space.md }} testID="maintenance-list">
      {windows.data.map((w) => (
        <WindowRow key={w.id} window={w} writer={writer} />
      ))}
    </View>
  );
  return (
    <View style={{ flexDirection: isWide ? 'row' : 'column', alignItems: isWide ? 'flex-start' : 'stretch', gap: theme.space.xl }}>
      <View style={{ flex: isWide ? 1 : undefined }}>{list}</View>
      {writer ? (
        <View style={isWide ? { width: theme.sizes.editorAsideWidth } : undefined}>
          <MaintenanceWindowForm />
        </View>
      ) : null}
    </View>
  );
}

function WindowRow({ window: w, writer }: { window: MaintenanceWindowView; writer: boolean }) {
  const theme = useTheme();
  const remove = useDeleteMaintenanceWindowMutation();
  const ended = Date.parse(w.endsAt) < Date.now();
  return (
    <Card testID={`maintenance-row-${w.id}`}>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: theme.space.md }}>
        <Text variant="bodyStrong">{w.service}</Text>
        <StatusMark tone={w.active ? 'caution' : 'off'} label={w.active ? 'Active now' : ended ? 'Ended' : 'Planned'} chip />
      </View>
      <Text variant="numberSmall" tone="muted">{`${formatDateTime(w.startsAt)} → ${formatDateTime(w.endsAt)}`}</Text>
      {w.reason ? <Text variant="small">{w.reason}</Text> : null}
      {remove.isError ? <Notice tone="bad">{describeError(remove.error)}</Notice> : null}
      {writer ? <Button label="Remove" kind="danger" compact icon="trash-2" busy={remove.isPending} onPress={() => remove.mutate(w.id)} testID={`maintenance-remove-${w.id}`} /> : null}
    </Card>
  );
}
