import { useRouter } from 'expo-router';
import { View } from 'react-native';
import { useDuplicateRuleMutation, useSetRuleEnabledMutation } from '../../hooks/queries/rules';
import type { RuleView } from '../../shared/rules/api-schemas';
import { RULE_KIND_LABELS } from '../../shared/rules/rule-schema';
import { describeError } from '../format/describe-error';
import { useTheme } from '../theme';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { StatusMark } from '../ui/status-mark';
import { Text } from '../ui/text';

export function RuleRow({ rule, writer }: { rule: RuleView; writer: boolean }) {
  const theme = useTheme();
  const router = useRouter();
  const toggle = useSetRuleEnabledMutation();
  const duplicate = useDuplicateRuleMutation();
  const error = toggle.error ?? duplicate.error;
  return (
    <View
      testID={`rule-row-${rule.id}`}
      style={{
        backgroundColor: theme.colors.surface,
        borderWidth: theme.borders.hairline,
        borderColor: theme.colors.line,
        borderRadius: theme.radii.md,
        padding: theme.space.lg,
        gap: theme.space.sm,
      }}
    >
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: theme.space.md }}>
        <Text variant="bodyStrong" testID={`rule-name-${rule.id}`} style={{ flexShrink: 1 }}>
          {rule.name}
        </Text>
        <StatusMark tone={rule.enabled ? 'good' : 'off'} label={rule.enabled ? 'Enabled' : 'Disabled'} testID={`rule-enabled-${rule.id}`} />
      </View>
      <Text variant="small" tone="muted">
        {`${RULE_KIND_LABELS[rule.kind]} · ${rule.service} · ${rule.severity === 'page' ? 'Page' : 'Ticket'}`}
      </Text>
      <Text variant="code" tone="muted">
        {rule.condition}
      </Text>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.md }}>
        {rule.open.raised > 0 ? <StatusMark tone="bad" label={`${rule.open.raised} raised`} /> : null}
        {rule.open.pending > 0 ? <StatusMark tone="caution" label={`${rule.open.pending} pending`} /> : null}
        {rule.open.noData > 0 ? <StatusMark tone="missing" label={`${rule.open.noData} no data`} /> : null}
        {rule.open.raised + rule.open.pending + rule.open.noData === 0 ? (
          <Text variant="small" tone="faint">
            Nothing open
          </Text>
        ) : null}
      </View>
      {error ? <Notice tone="bad">{describeError(error)}</Notice> : null}
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.sm }}>
        <Button label={writer ? 'Edit' : 'View'} compact icon="edit-2" onPress={() => router.push(`/alerts/rules/${rule.id}`)} testID={`rule-edit-${rule.id}`} />
        {writer ? (
          <>
            <Button
              label={rule.enabled ? 'Disable' : 'Enable'}
              compact
              icon={rule.enabled ? 'pause' : 'play'}
              busy={toggle.isPending}
              onPress={() => toggle.mutate({ id: rule.id, enabled: !rule.enabled })}
              testID={`rule-toggle-${rule.id}`}
            />
            <Button
              label="Duplicate"
              compact
              icon="copy"
              busy={duplicate.isPending}
              onPress={() => duplicate.mutate(rule.id, { onSuccess: (copy) => router.push(`/alerts/rules/${copy.id}`) })}
              testID={`rule-duplicate-${rule.id}`}
            />
          </>
        ) : null}
      </View>
    </View>
  );
}
