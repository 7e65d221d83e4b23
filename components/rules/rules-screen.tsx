import { useRouter } from 'expo-router';
import { View } from 'react-native';
import { useRulesQuery } from '../../hooks/queries/rules';
import { useSessionUser } from '../../hooks/queries/session';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import type { RuleView } from '../../shared/rules/api-schemas';
import { describeError } from '../format/describe-error';
import { useTheme } from '../theme';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { EmptyState } from '../ui/empty-state';
import { Loading } from '../ui/loading';
import { Notice } from '../ui/notice';
import { Screen } from '../ui/screen';
import { TextLink } from '../ui/text-link';
import { canWriteRules } from './can-write-rules';
import { RuleRow } from './rule-row';

export function RulesScreen() {
  const router = useRouter();
  const writer = canWriteRules(useSessionUser());
  return (
    <Screen
      title="Alert rules"
      description="Conditions on signals that raise alerts. Replay a rule against history before saving it."
      before={<TextLink href="/alerts" label="‹ Alerts" variant="smallStrong" testID="rules-back" />}
      actions={writer ? <Button label="New rule" kind="primary" icon="plus" onPress={() => router.push('/alerts/rules/new')} testID="rules-new" /> : undefined}
      testID="rules-screen"
    >
      <RulesContent writer={writer} />
    </Screen>
  );
}

function RulesContent({ writer }: { writer: boolean }) {
  const rules = useRulesQuery();
  if (rules.isPending) return <Loading label="Loading rules…" />;
  if (rules.isError) return <Notice tone="bad">{describeError(rules.error)}</Notice>;
  return <RulesList rules={rules.data} writer={writer} />;
}

/** Phone: one column. Wide: two columns of rules, so a long list does not stretch into lines. */
function RulesList({ rules, writer }: { rules: RuleView[]; writer: boolean }) {
  const theme = useTheme();
  const { isWide } = useBreakpoints();
  if (rules.length === 0) {
    return (
      <Card>
        <EmptyState
          testID="rules-empty"
          title="No alert rules yet"
          body="A rule watches one signal of a service. Every rule needs a responder note: what the person paged should check or do first."
        />
      </Card>
    );
  }
  return (
    <View testID="rules-list" style={{ flexDirection: isWide ? 'row' : 'column', flexWrap: 'wrap', gap: theme.space.md }}>
      {rules.map((r) => (
        <View key={r.id} style={isWide ? { flexBasis: '48%', flexGrow: 1 } : undefined}>
          <RuleRow rule={r} writer={writer} />
        </View>
      ))}
    </View>
  );
}
