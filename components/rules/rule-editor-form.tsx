import { useRouter } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import { useReplayMutation, useSaveRuleMutation } from '../../hooks/queries/rules';
import { useSessionUser } from '../../hooks/queries/session';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import { isApiError } from '../../hooks/api-client';
import { RULE_KIND_LABELS, RULE_KINDS, ruleDocumentSchema, type RuleKind } from '../../shared/rules/rule-schema';
import { Checkbox } from '../forms/checkbox';
import { SelectField } from '../forms/select-field';
import { TextField } from '../forms/text-field';
import { describeError } from '../format/describe-error';
import { useTheme } from '../theme';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { Notice } from '../ui/notice';
import { canWriteRules } from './can-write-rules';
import { FieldRow, KindFields, type FormErrors } from './kind-fields';
import { ReplayPanel } from './replay-panel';
import { formField, toDraft, type RuleForm } from './rule-form';
import { ServicePicker, SignalPicker } from './signal-fields';

const KIND_OPTIONS = RULE_KINDS.map((k) => ({ value: k, label: RULE_KIND_LABELS[k] }));
const HAS_THRESHOLD: readonly RuleKind[] = ['threshold', 'counter_rate', 'error_ratio', 'latency_quantile', 'latency_share', 'rate_of_change'];

/** Schema issues (client) or a server refusal → one message per form field. */
function errorsFrom(issues: Array<{ path: PropertyKey[]; message: string }>): FormErrors {
  const out: FormErrors = {};
  for (const issue of issues) {
    const key = formField(issue.path.map(String).join('.'));
    out[key] ??= issue.message;
  }
  return out;
}

function serverErrors(error: unknown): FormErrors {
  if (isApiError(error) && error.field) {
    const key = formField(error.field);
    // The server's message starts with the field's own name ("window: …"); the field shows it anyway.
    return { [key]: error.message.replace(/^[\w.]+: /, '') };
  }
  return { form: describeError(error) };
}

/** The rule editor: the structured form per kind, a replay against history, then save. */
export function RuleEditorForm({ id, initial }: { id: number | null; initial: RuleForm }) {
  const theme = useTheme();
  const router = useRouter();
  const { isWide } = useBreakpoints();
  const writer = canWriteRules(useSessionUser());
  const [form, setForm] = useState<RuleForm>(initial);
  const [errors, setErrors] = useState<FormErrors>({});
  const save = useSaveRuleMutation();
  const replay = useReplayMutation();
  const [replayError, setReplayError] = useState<string | undefined>();

  const set = <K extends keyof RuleForm>(key: K, value: RuleForm[K]) => {
    setForm((f) => {
      const next = { ...f, [key]: value };
      if (key === 'service') next.signal = next.requestsSignal = '';
      if (key === 'kind') next.signal = next.requestsSignal = '';
      return next;
    });
    setErrors((e) => ({ ...e, [key]: undefined, form: undefined }));
  };

  /** The document, or null after showing what is wrong at its fields. */
  const checked = () => {
    const draft = toDraft(form);
    const parsed = ruleDocumentSchema.safeParse(draft);
    if (!parsed.success) {
      setErrors(errorsFrom(parsed.error.issues));
      return null;
    }
    setErrors({});
    return draft;
  };

  const onReplay = (periodMs: number) => {
    setReplayError(undefined);
    const draft = checked();
    if (!draft) {
      setReplayError('Fix the fields marked above, then replay.');
      return;
    }
    const to = Date.now();
    replay.mutate(
      { draft, from: to - periodMs, to },
      {
        onError: (error) => {
          const e = serverErrors(error);
          setErrors(e);
          setReplayError(e.form ?? 'The replay was refused: see the field marked in the form.');
        },
      },
    );
  };

  const onSave = () => {
    const draft = checked();
    if (!draft) return;
    save.mutate({ id, draft }, { onSuccess: () => router.replace('/alerts/rules'), onError: (error) => setErrors(serverErrors(error)) });
  };

  const threshold = HAS_THRESHOLD.includes(form.kind) && form.threshold.trim() !== '' && Number.isFinite(Number(form.threshold)) ? Number(form.threshold) : null;
  const fields = (
    <View style={{ gap: theme.space.xl, flex: isWide ? 1 : undefined }}>
      {!writer ? <Notice tone="info">Engineers and admins edit rules; you can read this one.</Notice> : null}
      <Card title="What to watch">
        <SelectField label="Kind" accessibilityLabel="Rule kind" value={form.kind} options={KIND_OPTIONS} onChange={(v) => set('kind', v)} testID="rule-kind" />
        <TextField label="Name" value={form.name} onChangeText={(v) => set('name', v)} error={errors.name} testID="rule-name" />
        <ServicePicker value={form.service} onChange={(v) => set('service', v)} error={errors.service} />
        <SignalPicker service={form.service} kind={form.kind} value={form.signal} onChange={(v) => set('signal', v)} error={errors.signal} />
        <TextField
          label="Label filters"
          value={form.filters}
          onChangeText={(v) => set('filters', v)}
          error={errors.filters}
          hint="name=value, separated by commas; empty reads every series."
          mono
          testID="rule-filters"
        />
        <TextField
          label="Group by"
          value={form.groupBy}
          onChangeText={(v) => set('groupBy', v)}
          error={errors.groupBy}
          hint="Label names, separated by commas: one alert per value. Empty: one alert for the whole rule."
          mono
          testID="rule-group-by"
        />
      </Card>
      <Card title="Condition">
        <KindFields form={form} set={set} errors={errors} />
        <FieldRow>
          <View style={{ flexGrow: 1, flexBasis: theme.sizes.figureColumn, minWidth: theme.sizes.figureColumn }}>
            <TextField label="Window" value={form.window} onChangeText={(v) => set('window', v)} error={errors.window} hint="Looks back this far, e.g. 5m." mono testID="rule-window" />
          </View>
          <View style={{ flexGrow: 1, flexBasis: theme.sizes.figureColumn, minWidth: theme.sizes.figureColumn }}>
            <TextField label="Sustain" value={form.sustain} onChangeText={(v) => set('sustain', v)} error={errors.sustain} hint="Pending this long, then raised." mono testID="rule-sustain" />
          </View>
          <View style={{ flexGrow: 1, flexBasis: theme.sizes.figureColumn, minWidth: theme.sizes.figureColumn }}>
            <TextField label="Clear" value={form.clear} onChangeText={(v) => set('clear', v)} error={errors.clear} hint="False this long, then cleared." mono testID="rule-clear" />
          </View>
        </FieldRow>
      </Card>
      <Card title="Who is told, and what to do">
        <SelectField
          label="Severity"
          accessibilityLabel="Severity"
          value={form.severity}
          options={[
            { value: 'page', label: 'Page: someone acts now' },
            { value: 'ticket', label: 'Ticket: next working day' },
          ]}
          onChange={(v) => set('severity', v)}
          testID="rule-severity"
        />
        <TextField
          label="Responder note (required)"
          value={form.responderNote}
          onChangeText={(v) => set('responderNote', v)}
          error={errors.responderNote}
          hint="What the person paged should check or do first. It heads every alert and every message."
          multiline
          numberOfLines={4}
          testID="rule-responder-note"
        />
        <TextField label="Runbook link" value={form.runbookUrl} onChangeText={(v) => set('runbookUrl', v)} error={errors.runbookUrl} placeholder="https://" autoCapitalize="none" testID="rule-runbook" />
        <TextField
          label="Recipients"
          value={form.recipients}
          onChangeText={(v) => set('recipients', v)}
          error={errors.recipients}
          hint="Email addresses, separated by commas."
          autoCapitalize="none"
          keyboardType="email-address"
          testID="rule-recipients"
        />
        <Checkbox checked={form.enabled} onChange={(v) => set('enabled', v)} label="Enabled" detail="Evaluated every cycle once saved." testID="rule-enabled" />
      </Card>
    </View>
  );
  const actions = (
    <View style={{ gap: theme.space.md }}>
      {errors.form ? (
        <Notice tone="bad" testID="rule-form-error">
          {errors.form}
        </Notice>
      ) : null}
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.md }}>
        <Button label={id === null ? 'Save rule' : 'Save changes'} kind="primary" icon="check" onPress={onSave} busy={save.isPending} disabled={!writer} testID="rule-save" />
        <Button label="Cancel" kind="quiet" onPress={() => router.replace('/alerts/rules')} testID="rule-cancel" />
      </View>
    </View>
  );
  const replayPanel = (
    <ReplayPanel result={replay.data} threshold={threshold} busy={replay.isPending} error={replayError} onReplay={writer ? onReplay : () => setReplayError('Engineers and admins replay rules.')} />
  );
  if (!isWide) {
    return (
      <View style={{ gap: theme.space.xl }}>
        {fields}
        {replayPanel}
        {actions}
      </View>
    );
  }
  return (
    <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.xl }}>
      {fields}
      <View style={{ flex: 1, gap: theme.space.xl }}>
        {replayPanel}
        {actions}
      </View>
    </View>
  );
}
