import { useState } from 'react';
import { View } from 'react-native';
import { useCreateMaintenanceWindowMutation } from '../../../hooks/queries/maintenance';
import { maintenanceWindowSchema } from '../../../shared/rules/api-schemas';
import { checkForm, serverFieldError, type FieldErrors } from '../../forms/field-errors';
import { TextField } from '../../forms/text-field';
import { describeError } from '../../format/describe-error';
import { ServicePicker } from '../../rules/signal-fields';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { Notice } from '../../ui/notice';

const FIELDS = ['service', 'startsAt', 'endsAt', 'reason'] as const;
type Field = (typeof FIELDS)[number];

/** "2025-03-01 14:30" in local time, as people type it. */
function localText(ms: number): string {
  const d = new Date(ms);
  const p = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())} ${p(d.getHours())}:${p(d.getMinutes())}`;
}

/** Local "YYYY-MM-DD HH:MM" → ISO; anything else goes to the schema as typed, which names the problem. */
function toIso(text: string): string {
  const m = /^\s*(\d{4})-(\d{2})-(\d{2})[ T](\d{2}):(\d{2})\s*$/.exec(text);
  if (!m) return text;
  return new Date(Number(m[1]), Number(m[2]) - 1, Number(m[3]), Number(m[4]), Number(m[5])).toISOString();
}

export function MaintenanceWindowForm() {
  const theme = useTheme();
  const create = useCreateMaintenanceWindowMutation();
  const [service, setService] = useState('');
  const [startsAt, setStartsAt] = useState(() => localText(Date.now()));
  const [endsAt, setEndsAt] = useState(() => localText(Date.now() + 3_600_000));
  const [reason, setReason] = useState('');
  const [errors, setErrors] = useState<FieldErrors<Field | 'form'>>({});
  const submit = () => {
    const checked = checkForm(maintenanceWindowSchema, { service, startsAt: toIso(startsAt), endsAt: toIso(endsAt), reason });
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    create.mutate(checked.data, {
      onSuccess: () => setReason(''),
      onError: (error) => setErrors(serverFieldError(error, FIELDS) ?? { form: describeError(error) }),
    });
  };
  return (
    <Card title="Plan a window" description="During a window the service's rules keep evaluating and recording, but nothing is sent; its alerts are marked planned." testID="maintenance-form">
      <ServicePicker value={service} onChange={setService} error={errors.service} testID="maintenance-service" />
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.md }}>
        <View style={{ flexGrow: 1, flexBasis: theme.sizes.fieldMin }}>
          <TextField label="Starts" value={startsAt} onChangeText={setStartsAt} error={errors.startsAt} hint="Local time, YYYY-MM-DD HH:MM" mono testID="maintenance-starts" />
        </View>
        <View style={{ flexGrow: 1, flexBasis: theme.sizes.fieldMin }}>
          <TextField label="Ends" value={endsAt} onChangeText={setEndsAt} error={errors.endsAt} mono testID="maintenance-ends" />
        </View>
      </View>
      <TextField label="Reason" value={reason} onChangeText={setReason} error={errors.reason} hint="What is planned, so responders know." testID="maintenance-reason" />
      {errors.form ? <Notice tone="bad">{errors.form}</Notice> : null}
      <Button label="Add window" kind="primary" icon="plus" onPress={submit} busy={create.isPending} testID="maintenance-submit" />
    </Card>
  );
}
