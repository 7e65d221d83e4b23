import { useState } from 'react';
import { View } from 'react-native';
import { useSessionUser } from '../../../hooks/queries/session';
import { useDeleteSecretMutation, useSaveSecretMutation, useSecretsQuery, type SecretMeta } from '../../../hooks/queries/secrets';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { NotAllowed } from '../../auth/not-allowed';
import { isAdmin } from '../../auth/roles';
import { describeError } from '../../format/describe-error';
import { formatDate, formatRelative } from '../../format/time';
import { checkForm, serverFieldError, type FieldErrors } from '../../forms/field-errors';
import { FieldMessage } from '../../forms/field-message';
import { loadJourneySchemas } from '../../forms/journey-schemas';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { ConfirmStrip } from '../../ui/confirm-strip';
import { EmptyState } from '../../ui/empty-state';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { Text } from '../../ui/text';
import { SettingsPage } from '../settings-page';

export function SecretsScreen() {
  return (
    <SettingsPage
      title="Secrets"
      description="Passwords and tokens that journey steps use as {{secret.NAME}}. Values are encrypted at rest, sent only to the target, redacted from stored responses and never shown again."
      testID="secrets-screen"
    >
      <SecretsContent />
    </SettingsPage>
  );
}

function SecretsContent() {
  const theme = useTheme();
  const user = useSessionUser();
  const admin = isAdmin(user);
  const { isWide } = useBreakpoints();
  const secrets = useSecretsQuery({ enabled: admin });
  if (!user) return null;
  if (!admin) return <NotAllowed role={user.role} what="Only admins see and change secrets." />;
  const list = secrets.isPending ? (
    <Loading label="Loading secrets…" />
  ) : secrets.isError ? (
    <Notice tone="bad" title="Could not load secrets">
      {describeError(secrets.error, user.role)}
    </Notice>
  ) : (
    <SecretList secrets={secrets.data} />
  );
  const form = <SecretForm />;
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
      {form}
      {list}
    </View>
  );
}

function SecretList({ secrets }: { secrets: SecretMeta[] }) {
  const theme = useTheme();
  return (
    <Card title="Stored secrets" aside={<Text variant="numberSmall" tone="muted">{String(secrets.length)}</Text>} testID="secret-list">
      {secrets.length === 0 ? (
        <EmptyState title="No secrets yet" body="Add one before a journey refers to it; a HAR import stores the credentials it finds here too." />
      ) : (
        <View>
          {secrets.map((s, i) => (
            <View key={s.name} style={i > 0 ? { borderTopWidth: theme.borders.hairline, borderTopColor: theme.colors.line } : undefined}>
              <SecretRow secret={s} />
            </View>
          ))}
        </View>
      )}
    </Card>
  );
}

function SecretRow({ secret }: { secret: SecretMeta }) {
  const theme = useTheme();
  const remove = useDeleteSecretMutation();
  const [confirming, setConfirming] = useState(false);
  return (
    <View testID={`secret-row-${secret.name}`} style={{ paddingVertical: theme.space.md, gap: theme.space.sm }}>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: theme.space.md }}>
        <View style={{ gap: theme.space.xxs, flexShrink: 1 }}>
          <Text variant="code">{`{{secret.${secret.name}}}`}</Text>
          <Text variant="small" tone="muted">
            {'Added '}
            <Text variant="numberSmall" tone="muted">
              {formatDate(secret.createdAt)}
            </Text>
            {' · changed '}
            <Text variant="numberSmall" tone="muted">
              {formatRelative(secret.updatedAt)}
            </Text>
          </Text>
        </View>
        {confirming ? null : <Button label="Delete" kind="danger" compact onPress={() => setConfirming(true)} testID={`secret-delete-${secret.name}`} />}
      </View>
      {confirming ? (
        <ConfirmStrip
          question={`Delete ${secret.name}? Journeys that use it cannot be saved again, and their runs fail, until it is added back.`}
          confirmLabel="Delete secret"
          busy={remove.isPending}
          onConfirm={() => remove.mutate(secret.name, { onSuccess: () => setConfirming(false) })}
          onCancel={() => setConfirming(false)}
          confirmTestID={`secret-delete-confirm-${secret.name}`}
          cancelTestID={`secret-delete-cancel-${secret.name}`}
        />
      ) : null}
      {remove.isError ? <FieldMessage error={describeError(remove.error)} /> : null}
    </View>
  );
}

type Field = 'name' | 'value';
const FIELDS: readonly Field[] = ['name', 'value'];

function SecretForm() {
  const theme = useTheme();
  const save = useSaveSecretMutation();
  const [name, setName] = useState('');
  const [value, setValue] = useState('');
  const [errors, setErrors] = useState<FieldErrors<Field>>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);

  const submit = async () => {
    setProblem(null);
    setDone(null);
    const { saveSecretSchema } = await loadJourneySchemas();
    const checked = checkForm(saveSecretSchema, { name: name.trim(), value });
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    save.mutate(checked.data, {
      onSuccess: (answer) => {
        // The value leaves the screen as soon as it is stored.
        setValue('');
        setName('');
        setDone(answer.outcome === 'created' ? `Stored ${answer.name}.` : `Replaced the value of ${answer.name}.`);
      },
      onError: (error) => {
        const atField = serverFieldError(error, FIELDS);
        if (atField) setErrors(atField);
        else setProblem(describeError(error));
      },
    });
  };

  return (
    <Card title="Add or replace a secret" description="Saving under an existing name replaces its value." testID="secret-form">
      <View style={{ gap: theme.space.lg }}>
        <TextField label="Name" hint="Letters, digits and _, such as SHOP_PASSWORD." value={name} onChangeText={(v) => { setName(v); setDone(null); }} error={errors.name} testID="secret-name" mono autoCapitalize="characters" autoComplete="off" />
        <TextField label="Value" value={value} onChangeText={(v) => { setValue(v); setDone(null); }} error={errors.value} testID="secret-value" secureTextEntry autoComplete="off" autoCapitalize="none" onSubmitEditing={() => void submit()} />
        {problem ? <Notice tone="bad">{problem}</Notice> : null}
        {done ? <Notice tone="good" testID="secret-saved">{done}</Notice> : null}
        <Button label="Store secret" kind="primary" icon="lock" onPress={() => void submit()} busy={save.isPending} testID="secret-save" />
      </View>
    </Card>
  );
}
