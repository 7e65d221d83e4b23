import { useState } from 'react';
import { View } from 'react-native';
import { useCreateUserMutation } from '../../../hooks/queries/users';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { ROLE_LABELS, type Role } from '../../../shared/roles';
import { createUserSchema } from '../../../shared/schemas/users';
import { ROLE_ABILITIES } from '../../auth/roles';
import { describeError } from '../../format/describe-error';
import { checkForm, serverFieldError, type FieldErrors } from '../../forms/field-errors';
import { SelectField } from '../../forms/select-field';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { Notice } from '../../ui/notice';
import { ROLE_OPTIONS } from './role-options';

type Field = 'name' | 'email' | 'role' | 'password';
const FIELDS: readonly Field[] = ['name', 'email', 'role', 'password'];

interface Values {
  name: string;
  email: string;
  role: Role;
  password: string;
}

// The least powerful role is the default: raising it is a deliberate choice.
const EMPTY: Values = { name: '', email: '', role: 'reviewer', password: '' };

export function AddPersonForm({ viewerRole }: { viewerRole: Role }) {
  const theme = useTheme();
  const { atLeastTablet } = useBreakpoints();
  const create = useCreateUserMutation();
  const [values, setValues] = useState<Values>(EMPTY);
  const [errors, setErrors] = useState<FieldErrors<Field>>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [added, setAdded] = useState<string | null>(null);

  const set = <K extends Field>(key: K, value: Values[K]) => {
    setValues((current) => ({ ...current, [key]: value }));
    if (errors[key]) setErrors((current) => ({ ...current, [key]: undefined }));
    setAdded(null);
  };

  const submit = () => {
    setProblem(null);
    setAdded(null);
    const checked = checkForm(createUserSchema, values);
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    create.mutate(checked.data, {
      onSuccess: (person) => {
        setValues(EMPTY);
        setAdded(`Added ${person.name} (${person.email}) as ${ROLE_LABELS[person.role]}. Give them their password privately.`);
      },
      onError: (error) => {
        const atField = serverFieldError(error, FIELDS);
        if (atField) setErrors(atField);
        else setProblem(describeError(error, viewerRole));
      },
    });
  };

  const row = { flexDirection: atLeastTablet ? 'row' : 'column', gap: theme.space.lg } as const;
  const cell = atLeastTablet ? { flex: 1 } : undefined;

  return (
    <Card title="Add a person" description="They sign in with this email and password. Their role decides what they may change." testID="people-add">
      <View style={{ gap: theme.space.lg }}>
        <View style={row}>
          <View style={cell}>
            <TextField label="Name" testID="people-add-name" value={values.name} onChangeText={(v) => set('name', v)} error={errors.name} autoComplete="off" />
          </View>
          <View style={cell}>
            <TextField
              label="Email"
              testID="people-add-email"
              value={values.email}
              onChangeText={(v) => set('email', v)}
              error={errors.email}
              keyboardType="email-address"
              autoCapitalize="none"
              autoComplete="off"
            />
          </View>
        </View>
        <View style={row}>
          <View style={cell}>
            <SelectField
              label="Role"
              accessibilityLabel="Role"
              testID="people-add-role"
              value={values.role}
              options={ROLE_OPTIONS}
              onChange={(v) => set('role', v)}
              error={errors.role}
              hint={ROLE_ABILITIES[values.role]}
            />
          </View>
          <View style={cell}>
            <TextField
              label="Password"
              testID="people-add-password"
              value={values.password}
              onChangeText={(v) => set('password', v)}
              error={errors.password}
              hint="At least 12 characters."
              secureTextEntry
              autoComplete="new-password"
              autoCapitalize="none"
              onSubmitEditing={submit}
            />
          </View>
        </View>
        {problem ? <Notice tone="bad">{problem}</Notice> : null}
        {added ? (
          <Notice tone="good" testID="people-add-done">
            {added}
          </Notice>
        ) : null}
        <Button label="Add person" kind="primary" icon="plus" onPress={submit} busy={create.isPending} testID="people-add-submit" />
      </View>
    </Card>
  );
}
