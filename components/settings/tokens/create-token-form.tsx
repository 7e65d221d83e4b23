import { useState } from 'react';
import { View } from 'react-native';
import { useCreateTokenMutation } from '../../../hooks/queries/tokens';
import { SCOPE_LABELS, TOKEN_SCOPES, type Role, type TokenScope } from '../../../shared/roles';
import { createTokenSchema, type CreatedToken } from '../../../shared/schemas/tokens';
import { describeError } from '../../format/describe-error';
import { Checkbox } from '../../forms/checkbox';
import { checkForm, serverFieldError, type FieldErrors } from '../../forms/field-errors';
import { FieldMessage } from '../../forms/field-message';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { Notice } from '../../ui/notice';
import { Text } from '../../ui/text';

type Field = 'name' | 'scopes';
const FIELDS: readonly Field[] = ['name', 'scopes'];

const SCOPE_DETAILS: Record<TokenScope, string> = {
  ingest: 'A service sends its metrics.',
  releases: 'A delivery pipeline records deploys.',
  read: 'A script or report tool reads results.',
};

export function CreateTokenForm({ viewerRole, onCreated }: { viewerRole: Role; onCreated: (created: CreatedToken) => void }) {
  const theme = useTheme();
  const create = useCreateTokenMutation();
  const [name, setName] = useState('');
  const [scopes, setScopes] = useState<TokenScope[]>([]);
  const [errors, setErrors] = useState<FieldErrors<Field>>({});
  const [problem, setProblem] = useState<string | null>(null);

  const toggle = (scope: TokenScope, on: boolean) => {
    // Keep the schema's order so the list reads the same everywhere.
    setScopes((current) => TOKEN_SCOPES.filter((s) => (s === scope ? on : current.includes(s))));
    if (errors.scopes) setErrors((current) => ({ ...current, scopes: undefined }));
  };

  const submit = () => {
    setProblem(null);
    const checked = checkForm(createTokenSchema, { name, scopes });
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    create.mutate(checked.data, {
      onSuccess: (created) => {
        setName('');
        setScopes([]);
        onCreated(created);
      },
      onError: (error) => {
        const atField = serverFieldError(error, FIELDS);
        if (atField) setErrors(atField);
        else setProblem(describeError(error, viewerRole));
      },
    });
  };

  return (
    <Card title="Create a token" description="Give each machine its own token with only the scopes it needs." testID="token-create-form">
      <View style={{ gap: theme.space.lg }}>
        <TextField
          label="Name"
          hint="Say who uses it, such as checkout-service or deploy pipeline."
          testID="token-name"
          value={name}
          onChangeText={(value) => {
            setName(value);
            if (errors.name) setErrors((current) => ({ ...current, name: undefined }));
          }}
          error={errors.name}
          autoCapitalize="none"
          autoComplete="off"
        />
        <View accessibilityRole="list" accessibilityLabel="Scopes" style={{ gap: theme.space.xs }}>
          <Text variant="label">Scopes</Text>
          {TOKEN_SCOPES.map((scope) => (
            <Checkbox
              key={scope}
              testID={`token-scope-${scope}`}
              label={SCOPE_LABELS[scope]}
              detail={SCOPE_DETAILS[scope]}
              checked={scopes.includes(scope)}
              onChange={(on) => toggle(scope, on)}
            />
          ))}
          <FieldMessage error={errors.scopes} />
        </View>
        {problem ? <Notice tone="bad">{problem}</Notice> : null}
        <Button label="Create token" kind="primary" icon="key" onPress={submit} busy={create.isPending} testID="token-create" />
      </View>
    </Card>
  );
}
