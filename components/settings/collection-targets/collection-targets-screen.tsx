import { useState } from 'react';
import { View } from 'react-native';
import { useCollectionTargetsQuery } from '../../../hooks/queries/collection-targets';
import { useSessionUser } from '../../../hooks/queries/session';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import type { CollectionTargetView } from '../../../shared/schemas/signals';
import { describeError } from '../../format/describe-error';
import { canWriteSignals } from '../../signals/roles';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { EmptyState } from '../../ui/empty-state';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { Text } from '../../ui/text';
import { SettingsPage } from '../settings-page';
import { TargetForm } from './target-form';
import { TargetRow } from './target-row';

export function CollectionTargetsScreen() {
  return (
    <SettingsPage
      title="Collection targets"
      description="Services that publish their figures as a JSON document (a status or stats page) instead of sending metrics. The worker fetches each one on its interval and stores every number as a signal."
      testID="collection-targets-screen"
    >
      <CollectionTargetsContent />
    </SettingsPage>
  );
}

function CollectionTargetsContent() {
  const theme = useTheme();
  const user = useSessionUser();
  const writer = canWriteSignals(user);
  const { isWide } = useBreakpoints();
  const targets = useCollectionTargetsQuery();
  const [editing, setEditing] = useState<CollectionTargetView | null>(null);
  if (!user) return null;

  const list = targets.isPending ? (
    <Loading label="Loading targets…" />
  ) : targets.isError ? (
    <Notice tone="bad" title="Could not load collection targets">
      {describeError(targets.error, user.role)}
    </Notice>
  ) : (
    <Card title="Targets" aside={<Text variant="numberSmall" tone="muted">{`${targets.data.filter((t) => t.enabled).length} collecting`}</Text>} testID="target-list">
      {targets.data.length === 0 ? (
        <EmptyState title="No collection targets" body={writer ? 'Add the first one with its URL and interval.' : 'Engineers and admins add them.'} />
      ) : (
        <View>
          {targets.data.map((t, i) => (
            <View key={t.id} style={i > 0 ? { borderTopWidth: theme.borders.hairline, borderTopColor: theme.colors.line } : undefined}>
              <TargetRow target={t} writer={writer} onEdit={() => setEditing(t)} />
            </View>
          ))}
        </View>
      )}
    </Card>
  );
  if (!writer) {
    return (
      <View style={{ gap: theme.space.xl }}>
        <Notice tone="info">Engineers and admins add and change collection targets; you can see them here.</Notice>
        {list}
      </View>
    );
  }
  const form = <TargetForm editing={editing} onDone={() => setEditing(null)} />;
  if (isWide) {
    return (
      <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.xl }}>
        <View style={{ flex: 3 }}>{list}</View>
        <View style={{ flex: 2 }}>{form}</View>
      </View>
    );
  }
  return (
    <View style={{ gap: theme.space.xl }}>
      {editing ? form : list}
      {editing ? list : form}
    </View>
  );
}
