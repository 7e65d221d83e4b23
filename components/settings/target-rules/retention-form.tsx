import { useEffect, useState } from 'react';
import { View } from 'react-native';
import { useRetentionQuery, useSaveRetentionMutation } from '../../../hooks/queries/probe-settings';
import { describeError } from '../../format/describe-error';
import { checkForm, serverFieldError, type FieldErrors } from '../../forms/field-errors';
import { loadJourneySchemas } from '../../forms/journey-schemas';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';

type Field = 'runRetentionDays';

/** How long runs and their step results are kept; older days are dropped whole. */
export function RetentionForm() {
  const theme = useTheme();
  const retention = useRetentionQuery();
  const save = useSaveRetentionMutation();
  const [days, setDays] = useState('');
  const [errors, setErrors] = useState<FieldErrors<Field>>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  useEffect(() => {
    if (retention.data) setDays(String(retention.data.runRetentionDays));
  }, [retention.data]);

  const submit = async () => {
    setProblem(null);
    setDone(false);
    const { retentionSchema } = await loadJourneySchemas();
    const checked = checkForm(retentionSchema, { runRetentionDays: days.trim() === '' ? undefined : Number(days) });
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    save.mutate(checked.data, {
      onSuccess: () => setDone(true),
      onError: (error) => {
        const atField = serverFieldError(error, ['runRetentionDays'] as const);
        if (atField) setErrors(atField);
        else setProblem(describeError(error));
      },
    });
  };

  return (
    <Card title="Run retention" description="Runs older than this are dropped a whole day at a time." testID="retention-form">
      {retention.isPending ? (
        <Loading label="Loading…" />
      ) : retention.isError ? (
        <Notice tone="bad">{describeError(retention.error)}</Notice>
      ) : (
        <View style={{ gap: theme.space.lg }}>
          <TextField label="Keep runs for (days)" value={days} onChangeText={setDays} error={errors.runRetentionDays} testID="retention-days" mono keyboardType="number-pad" />
          {problem ? <Notice tone="bad">{problem}</Notice> : null}
          {done ? <Notice tone="good" testID="retention-saved">Saved.</Notice> : null}
          <Button label="Save retention" kind="primary" icon="check" onPress={() => void submit()} busy={save.isPending} testID="retention-save" />
        </View>
      )}
    </Card>
  );
}
