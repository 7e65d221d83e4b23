import { useEffect, useState } from 'react';
import { View } from 'react-native';
import { useSaveTargetRulesMutation, useTargetRulesQuery } from '../../../hooks/queries/probe-settings';
import { targetPolicySchema, type TargetPolicy } from '../../../shared/journey/target-policy-schema';
import { describeError } from '../../format/describe-error';
import { Checkbox } from '../../forms/checkbox';
import { TextField } from '../../forms/text-field';
import { isApiError } from '../../../hooks/api-client';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { Text } from '../../ui/text';

const lines = (text: string) => text.split(/[\n,]+/).map((l) => l.trim()).filter(Boolean);

/** "allow.2" → "allow", with the entry's line number in the message. */
function errorsOf(issues: ReadonlyArray<{ path: readonly PropertyKey[]; message: string }>): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of issues) {
    const [field, index] = issue.path;
    const key = String(field ?? 'form');
    if (out[key] === undefined) out[key] = typeof index === 'number' ? `line ${index + 1}: ${issue.message}` : issue.message;
  }
  return out;
}

export function TargetRulesForm() {
  const rules = useTargetRulesQuery();
  if (rules.isPending) return <Loading label="Loading target rules…" />;
  if (rules.isError) {
    return (
      <Notice tone="bad" title="Could not load target rules">
        {describeError(rules.error)}
      </Notice>
    );
  }
  return <RulesEditor saved={rules.data} />;
}

function RulesEditor({ saved }: { saved: TargetPolicy }) {
  const theme = useTheme();
  const save = useSaveTargetRulesMutation();
  const [allow, setAllow] = useState(saved.allow.join('\n'));
  const [deny, setDeny] = useState(saved.deny.join('\n'));
  const [allowLoopback, setAllowLoopback] = useState(saved.allowLoopback);
  const [allowLinkLocal, setAllowLinkLocal] = useState(saved.allowLinkLocal);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  useEffect(() => setDone(false), [allow, deny, allowLoopback, allowLinkLocal]);

  const submit = () => {
    setProblem(null);
    const result = targetPolicySchema.safeParse({ allow: lines(allow), deny: lines(deny), allowLoopback, allowLinkLocal });
    if (!result.success) {
      setErrors(errorsOf(result.error.issues));
      return;
    }
    setErrors({});
    save.mutate(result.data, {
      onSuccess: () => setDone(true),
      onError: (error) => {
        if (isApiError(error) && error.field) setErrors({ [error.field.split('.')[0]!]: error.message });
        else setProblem(describeError(error));
      },
    });
  };

  return (
    <Card title="Where probes may connect" testID="target-rules-form">
      <View style={{ gap: theme.space.lg }}>
        <Text variant="small" tone="muted">
          In order: an address in a deny range is refused; loopback and link-local (with cloud metadata) addresses are refused unless allowed below; when the allow list is not empty, anything outside it is refused; everything else is allowed.
        </Text>
        <TextField
          label="Allow (one address or CIDR range per line)"
          hint="Such as 10.0.0.0/8 or 203.0.113.7. Empty: any address the other rules do not refuse."
          value={allow}
          onChangeText={setAllow}
          error={errors.allow}
          testID="target-rules-allow"
          mono
          multiline
          numberOfLines={4}
          autoCapitalize="none"
        />
        <TextField
          label="Deny (one address or CIDR range per line)"
          value={deny}
          onChangeText={setDeny}
          error={errors.deny}
          testID="target-rules-deny"
          mono
          multiline
          numberOfLines={4}
          autoCapitalize="none"
        />
        <Checkbox
          label="Allow loopback"
          detail="127.0.0.0/8 and ::1: the machine a vantage runs on. Needed for the demo shop."
          checked={allowLoopback}
          onChange={setAllowLoopback}
          testID="target-rules-loopback"
        />
        <Checkbox
          label="Allow link-local and cloud metadata"
          detail="169.254.0.0/16, fe80::/10 and metadata services. Leave off unless a journey must reach them: they hand out cloud credentials."
          checked={allowLinkLocal}
          onChange={setAllowLinkLocal}
          testID="target-rules-link-local"
        />
        {problem ? <Notice tone="bad">{problem}</Notice> : null}
        {done ? <Notice tone="good" testID="target-rules-saved">Saved. Vantages apply the new rules within a few seconds.</Notice> : null}
        <Button label="Save target rules" kind="primary" icon="check" onPress={submit} busy={save.isPending} testID="target-rules-save" />
      </View>
    </Card>
  );
}
