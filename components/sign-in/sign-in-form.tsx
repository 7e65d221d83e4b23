import { useRef, useState } from 'react';
import type { TextInput } from 'react-native';
import { View } from 'react-native';
import { isApiError } from '../../hooks/api-client';
import { useSignInMutation } from '../../hooks/queries/session';
import { signInSchema } from '../../shared/schemas/auth';
import { describeError } from '../format/describe-error';
import { checkForm, serverFieldError, type FieldErrors } from '../forms/field-errors';
import { TextField } from '../forms/text-field';
import { useTheme } from '../theme';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';

type Field = 'email' | 'password';
const FIELDS: readonly Field[] = ['email', 'password'];

/** Inner part: the form, checked with the same schema the server uses. */
export function SignInForm() {
  const theme = useTheme();
  const signIn = useSignInMutation();
  const passwordRef = useRef<TextInput>(null);
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [errors, setErrors] = useState<FieldErrors<Field>>({});
  const [problem, setProblem] = useState<string | null>(null);

  const submit = () => {
    setProblem(null);
    const checked = checkForm(signInSchema, { email, password });
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    signIn.mutate(checked.data, {
      onError: (error) => {
        const atField = serverFieldError(error, FIELDS);
        if (atField) {
          setErrors(atField);
          return;
        }
        // Wrong email and wrong password read the same, on purpose.
        if (isApiError(error) && error.code === 'unauthorized') setProblem('Wrong email or password.');
        else setProblem(describeError(error));
      },
    });
  };

  return (
    <View style={{ gap: theme.space.lg }}>
      <TextField
        label="Email"
        testID="sign-in-email"
        value={email}
        onChangeText={(text) => {
          setEmail(text);
          if (errors.email) setErrors({ ...errors, email: undefined });
        }}
        error={errors.email}
        autoComplete="email"
        textContentType="username"
        keyboardType="email-address"
        autoCapitalize="none"
        returnKeyType="next"
        onSubmitEditing={() => passwordRef.current?.focus()}
      />
      <TextField
        ref={passwordRef}
        label="Password"
        testID="sign-in-password"
        value={password}
        onChangeText={(text) => {
          setPassword(text);
          if (errors.password) setErrors({ ...errors, password: undefined });
        }}
        error={errors.password}
        secureTextEntry
        autoComplete="current-password"
        textContentType="password"
        autoCapitalize="none"
        returnKeyType="go"
        onSubmitEditing={submit}
      />
      {problem ? (
        <Notice tone="bad" testID="sign-in-problem">
          {problem}
        </Notice>
      ) : null}
      <Button label={signIn.isPending ? 'Signing in…' : 'Sign in'} kind="primary" onPress={submit} busy={signIn.isPending} stretch testID="sign-in-submit" />
    </View>
  );
}
