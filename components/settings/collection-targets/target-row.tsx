import { useState } from 'react';
import { View } from 'react-native';
import { useDeleteCollectionTargetMutation } from '../../../hooks/queries/collection-targets';
import type { CollectionTargetView } from '../../../shared/schemas/signals';
import { describeError } from '../../format/describe-error';
import { formatRelative } from '../../format/time';
import { FieldMessage } from '../../forms/field-message';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { ConfirmStrip } from '../../ui/confirm-strip';
import { StatusMark, type StatusTone } from '../../ui/status-mark';
import { Text } from '../../ui/text';

function status(t: CollectionTargetView): { tone: StatusTone; label: string } {
  if (!t.enabled) return { tone: 'off', label: 'Paused' };
  if (t.lastError) return { tone: 'bad', label: 'Failing' };
  if (!t.lastRunAt) return { tone: 'missing', label: 'Not run yet' };
  return { tone: 'good', label: 'Collecting' };
}

/** One target: where, how often, what the last collection brought or what went wrong. */
export function TargetRow({ target, writer, onEdit }: { target: CollectionTargetView; writer: boolean; onEdit: () => void }) {
  const theme = useTheme();
  const remove = useDeleteCollectionTargetMutation();
  const [confirming, setConfirming] = useState(false);
  const s = status(target);
  const counters = target.counterKeys.length;
  return (
    <View testID={`target-row-${target.name}`} style={{ paddingVertical: theme.space.lg, gap: theme.space.sm }}>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-start', justifyContent: 'space-between', gap: theme.space.md }}>
        <View style={{ flexShrink: 1, gap: theme.space.xxs }}>
          <Text variant="bodyStrong">{target.name}</Text>
          <Text variant="numberSmall" tone="muted" selectable style={{ wordBreak: 'break-all' } as object}>
            {target.url}
          </Text>
        </View>
        <StatusMark tone={s.tone} label={s.label} chip testID={`target-status-${target.name}`} />
      </View>
      <Text variant="small" tone="muted">
        {`${target.service} · every `}
        <Text variant="numberSmall" tone="muted">{`${target.intervalSeconds} s`}</Text>
        {` · ${counters} counter key${counters === 1 ? '' : 's'}${target.prefix ? ` · prefix ${target.prefix}` : ''}`}
      </Text>
      <Text variant="small" tone="muted">
        {target.lastRunAt ? (
          <>
            {'Last collected '}
            <Text variant="numberSmall" tone="muted">
              {formatRelative(target.lastRunAt)}
            </Text>
            {target.lastSampleCount !== null ? (
              <>
                {', '}
                <Text variant="numberSmall" tone="muted">
                  {target.lastSampleCount}
                </Text>
                {' numbers'}
              </>
            ) : null}
          </>
        ) : target.enabled ? (
          <>
            {'First collection '}
            <Text variant="numberSmall" tone="muted">
              {formatRelative(target.nextRunAt)}
            </Text>
          </>
        ) : (
          'Never collected'
        )}
      </Text>
      {target.lastError ? <FieldMessage error={target.lastError} /> : null}
      {writer && !confirming ? (
        <View style={{ flexDirection: 'row', gap: theme.space.sm }}>
          <Button label="Change" compact icon="edit-2" onPress={onEdit} testID={`target-edit-${target.name}`} />
          <Button label="Remove" kind="danger" compact onPress={() => setConfirming(true)} testID={`target-delete-${target.name}`} />
        </View>
      ) : null}
      {confirming ? (
        <ConfirmStrip
          question={`Remove ${target.name}? It is no longer collected; samples already stored stay.`}
          confirmLabel="Remove target"
          busy={remove.isPending}
          onConfirm={() => remove.mutate(target.id, { onSuccess: () => setConfirming(false) })}
          onCancel={() => setConfirming(false)}
          confirmTestID={`target-delete-confirm-${target.name}`}
          cancelTestID={`target-delete-cancel-${target.name}`}
        />
      ) : null}
      {remove.isError ? <FieldMessage error={describeError(remove.error)} /> : null}
    </View>
  );
}
