import { useState } from 'react';
import { View } from 'react-native';
import { useSessionUser } from '../../../hooks/queries/session';
import { useAddVantageMutation, useDeleteVantageMutation, useVantagesQuery, type VantageView } from '../../../hooks/queries/vantages';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { isAdmin } from '../../auth/roles';
import { describeError } from '../../format/describe-error';
import { formatRelative } from '../../format/time';
import { checkForm, serverFieldError, type FieldErrors } from '../../forms/field-errors';
import { FieldMessage } from '../../forms/field-message';
import { loadJourneySchemas } from '../../forms/journey-schemas';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { ConfirmStrip } from '../../ui/confirm-strip';
import { Card } from '../../ui/card';
import { EmptyState } from '../../ui/empty-state';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { StatusMark } from '../../ui/status-mark';
import { Text } from '../../ui/text';
import { SettingsPage } from '../settings-page';

export function VantagesScreen() {
  return (
    <SettingsPage
      title="Vantages"
      description="The places journeys run from. A vantage is a worker started with that name (PARALLAX_VANTAGE); it sends a heartbeat every few seconds, and a silent one is shown as down."
      testID="vantages-screen"
    >
      <VantagesContent />
    </SettingsPage>
  );
}

function VantagesContent() {
  const theme = useTheme();
  const user = useSessionUser();
  const admin = isAdmin(user);
  const { isWide } = useBreakpoints();
  const vantages = useVantagesQuery();
  if (!user) return null;
  const list = vantages.isPending ? (
    <Loading label="Loading vantages…" />
  ) : vantages.isError ? (
    <Notice tone="bad" title="Could not load vantages">
      {describeError(vantages.error, user.role)}
    </Notice>
  ) : (
    <VantageList vantages={vantages.data} admin={admin} />
  );
  if (!admin) return list;
  const form = <AddVantageForm />;
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
      {list}
      {form}
    </View>
  );
}

function VantageList({ vantages, admin }: { vantages: VantageView[]; admin: boolean }) {
  const theme = useTheme();
  const down = vantages.filter((v) => !v.up).length;
  return (
    <Card
      title="Vantages"
      aside={<Text variant="numberSmall" tone="muted">{`${vantages.length - down} up · ${down} down`}</Text>}
      testID="vantage-list"
    >
      {vantages.length === 0 ? (
        <EmptyState title="No vantages yet" body="Start a worker with a vantage name, or add the name here first so journeys can choose it." />
      ) : (
        <View>
          {vantages.map((v, i) => (
            <View key={v.name} style={i > 0 ? { borderTopWidth: theme.borders.hairline, borderTopColor: theme.colors.line } : undefined}>
              <VantageRow vantage={v} admin={admin} />
            </View>
          ))}
        </View>
      )}
    </Card>
  );
}

function VantageRow({ vantage, admin }: { vantage: VantageView; admin: boolean }) {
  const theme = useTheme();
  const remove = useDeleteVantageMutation();
  const [confirming, setConfirming] = useState(false);
  return (
    <View testID={`vantage-row-${vantage.name}`} style={{ paddingVertical: theme.space.md, gap: theme.space.sm }}>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: theme.space.md }}>
        <View style={{ gap: theme.space.xxs, flexShrink: 1 }}>
          <Text variant="bodyStrong">{vantage.name}</Text>
          <Text variant="small" tone="muted">
            {vantage.region ? `${vantage.region} · ` : ''}
            {vantage.lastBeatAt ? (
              <>
                {'last heartbeat '}
                <Text variant="numberSmall" tone="muted">
                  {formatRelative(vantage.lastBeatAt)}
                </Text>
              </>
            ) : (
              'no worker has reported from it'
            )}
          </Text>
        </View>
        <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.md }}>
          <StatusMark tone={vantage.up ? 'good' : 'bad'} label={vantage.up ? 'Up' : 'Down'} chip testID={`vantage-status-${vantage.name}`} />
          {admin && !confirming ? <Button label="Remove" kind="danger" compact onPress={() => setConfirming(true)} testID={`vantage-delete-${vantage.name}`} /> : null}
        </View>
      </View>
      {confirming ? (
        <ConfirmStrip
          question={`Remove ${vantage.name}? Journeys that run from it stop being scheduled there; its past runs stay.`}
          confirmLabel="Remove vantage"
          busy={remove.isPending}
          onConfirm={() => remove.mutate(vantage.name, { onSuccess: () => setConfirming(false) })}
          onCancel={() => setConfirming(false)}
          confirmTestID={`vantage-delete-confirm-${vantage.name}`}
          cancelTestID={`vantage-delete-cancel-${vantage.name}`}
        />
      ) : null}
      {remove.isError ? <FieldMessage error={describeError(remove.error)} /> : null}
    </View>
  );
}

type Field = 'name' | 'region';
const FIELDS: readonly Field[] = ['name', 'region'];

function AddVantageForm() {
  const theme = useTheme();
  const add = useAddVantageMutation();
  const [name, setName] = useState('');
  const [region, setRegion] = useState('');
  const [errors, setErrors] = useState<FieldErrors<Field>>({});
  const [problem, setProblem] = useState<string | null>(null);
  const submit = async () => {
    setProblem(null);
    const { saveVantageSchema } = await loadJourneySchemas();
    const checked = checkForm(saveVantageSchema, { name: name.trim(), region });
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    add.mutate(checked.data, {
      onSuccess: () => {
        setName('');
        setRegion('');
      },
      onError: (error) => {
        const atField = serverFieldError(error, FIELDS);
        if (atField) setErrors(atField);
        else setProblem(describeError(error));
      },
    });
  };
  return (
    <Card title="Add a vantage" description="Name it before its worker starts, or label one that already runs. Saving an existing name changes its region label." testID="vantage-form">
      <View style={{ gap: theme.space.lg }}>
        <TextField label="Name" hint="Lowercase letters, digits, ., _ and -, such as eu-west-1." value={name} onChangeText={setName} error={errors.name} testID="vantage-name" mono autoCapitalize="none" autoComplete="off" />
        <TextField label="Region label (optional)" value={region} onChangeText={setRegion} error={errors.region} testID="vantage-region" />
        {problem ? <Notice tone="bad">{problem}</Notice> : null}
        <Button label="Add vantage" kind="primary" icon="plus" onPress={() => void submit()} busy={add.isPending} testID="vantage-save" />
      </View>
    </Card>
  );
}
