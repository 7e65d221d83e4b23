import { useState } from 'react';
import { View } from 'react-native';
import { useCreateCollectionTargetMutation, useUpdateCollectionTargetMutation } from '../../../hooks/queries/collection-targets';
import { useServicesQuery } from '../../../hooks/queries/services';
import { useSignalsQuery } from '../../../hooks/queries/signals';
import { collectionTargetSchema, type CollectionTargetView } from '../../../shared/schemas/signals';
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
import { draftFromTarget, draftToInput, EMPTY_DRAFT, keysFromSignals, type TargetDraft } from './target-draft';

type Field = 'name' | 'service' | 'url' | 'intervalSeconds' | 'prefix' | 'labels' | 'counterKeys';
const FIELDS: readonly Field[] = ['name', 'service', 'url', 'intervalSeconds', 'prefix', 'labels', 'counterKeys'];

/** Add a target, or change one (editing = the target passed in). */
export function TargetForm({ editing, onDone }: { editing: CollectionTargetView | null; onDone: () => void }) {
  const services = useServicesQuery();
  const known = services.data?.some((s) => s.name === editing?.service) ?? false;
  const signals = useSignalsQuery(editing && known ? editing.service : null);
  if (editing && known && !signals.data && !signals.isError) return null;
  // Keys come from the signals stored under the target's prefix once it has been collected (the
  // API keeps no list of a document's keys; with no prefix, other signals of the service show too).
  const seen = editing?.lastRunAt ? keysFromSignals((signals.data ?? []).map((s) => s.name), editing.prefix) : [];
  return <TargetFormFields key={editing?.id ?? 'new'} editing={editing} initial={editing ? draftFromTarget(editing, seen) : EMPTY_DRAFT} seenKeys={seen} onDone={onDone} />;
}

function TargetFormFields({ editing, initial, seenKeys, onDone }: { editing: CollectionTargetView | null; initial: TargetDraft; seenKeys: string[]; onDone: () => void }) {
  const theme = useTheme();
  const create = useCreateCollectionTargetMutation();
  const update = useUpdateCollectionTargetMutation();
  const [draft, setDraft] = useState<TargetDraft>(initial);
  const [errors, setErrors] = useState<FieldErrors<Field>>({});
  const [problem, setProblem] = useState<string | null>(null);
  const set = (patch: Partial<TargetDraft>) => setDraft((d) => ({ ...d, ...patch }));
  const busy = create.isPending || update.isPending;

  const submit = () => {
    setProblem(null);
    const { input, labelError } = draftToInput(draft);
    if (labelError) {
      setErrors({ labels: labelError });
      return;
    }
    const checked = checkForm(collectionTargetSchema, input);
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    const handlers = {
      onSuccess: () => {
        if (!editing) setDraft(EMPTY_DRAFT);
        onDone();
      },
      onError: (error: unknown) => {
        const atField = serverFieldError(error, FIELDS);
        if (atField) setErrors(atField);
        else setProblem(describeError(error));
      },
    };
    if (editing) update.mutate({ id: editing.id, patch: checked.data }, handlers);
    else create.mutate(checked.data, handlers);
  };

  return (
    <Card
      title={editing ? `Change ${editing.name}` : 'Add a collection target'}
      description="The worker fetches the URL on the interval; every number in the JSON becomes a sample, its key path joined with dots (db.pool.size). Numbers are gauges unless marked as counters."
      testID="target-form"
    >
      <View style={{ gap: theme.space.lg }}>
        <TextField label="Name" value={draft.name} onChangeText={(name) => set({ name })} error={errors.name} testID="target-name" autoCapitalize="none" autoComplete="off" />
        <TextField label="URL" hint="An http or https address answering with a JSON document." value={draft.url} onChangeText={(url) => set({ url })} error={errors.url} testID="target-url" mono autoCapitalize="none" autoComplete="off" keyboardType="url" />
        <TextField label="Service" hint="The service its numbers belong to (created if new)." value={draft.service} onChangeText={(service) => set({ service })} error={errors.service} testID="target-service" autoCapitalize="none" autoComplete="off" />
        <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.md }}>
          <View style={{ flexGrow: 1, flexBasis: theme.sizes.figureColumn * 1.5 }}>
            <TextField label="Every (seconds)" value={draft.interval} onChangeText={(interval) => set({ interval })} error={errors.intervalSeconds} testID="target-interval" mono keyboardType="number-pad" />
          </View>
          <View style={{ flexGrow: 1, flexBasis: theme.sizes.figureColumn * 1.5 }}>
            <TextField label="Signal prefix" hint="Put before each key, such as app." value={draft.prefix} onChangeText={(prefix) => set({ prefix })} error={errors.prefix} testID="target-prefix" mono autoCapitalize="none" autoComplete="off" />
          </View>
        </View>
        <TextField label="Labels" hint="key=value, one per line, added to every sample." value={draft.labels} onChangeText={(labels) => set({ labels })} error={errors.labels} testID="target-labels" mono multiline autoCapitalize="none" autoComplete="off" />
        <View style={{ gap: theme.space.xs }}>
          <Text variant="label">Counters</Text>
          <Text variant="small" tone="muted">
            A counter only grows (a drop is a restart): requests served, bytes sent. Mark those, so rates and increases can be taken.
          </Text>
          {seenKeys.length ? (
            <View testID="target-seen-keys">
              <Text variant="small" tone="muted">
                {`Signals stored for ${editing?.service ?? 'the service'}${editing?.prefix ? ` under ${editing.prefix}` : ''}:`}
              </Text>
              {seenKeys.map((key) => (
                <Checkbox
                  key={key}
                  testID={`target-counter-${key}`}
                  label={key}
                  checked={draft.counterKeys.includes(key)}
                  onChange={(on) => set({ counterKeys: on ? [...draft.counterKeys, key] : draft.counterKeys.filter((k) => k !== key) })}
                />
              ))}
            </View>
          ) : (
            <Text variant="small" tone="muted">
              {editing ? 'No keys collected yet; list them below.' : 'Once it has been collected, its keys are listed here to tick.'}
            </Text>
          )}
          <TextField
            label={seenKeys.length ? 'Other counter keys' : 'Counter keys'}
            hint='One flattened key per line; "*" stands for one key part (http.*.count).'
            value={draft.otherCounterKeys}
            onChangeText={(otherCounterKeys) => set({ otherCounterKeys })}
            testID="target-counter-keys"
            mono
            multiline
            autoCapitalize="none"
            autoComplete="off"
          />
          <FieldMessage error={errors.counterKeys} />
        </View>
        <Checkbox testID="target-enabled" label="Collect" detail="Untick to pause without losing the settings." checked={draft.enabled} onChange={(enabled) => set({ enabled })} />
        {problem ? <Notice tone="bad">{problem}</Notice> : null}
        <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.sm }}>
          <Button label={editing ? 'Save changes' : 'Add target'} kind="primary" icon={editing ? 'check' : 'plus'} onPress={submit} busy={busy} testID="target-save" />
          {editing ? <Button label="Cancel" kind="quiet" onPress={onDone} testID="target-cancel" /> : null}
        </View>
      </View>
    </Card>
  );
}
