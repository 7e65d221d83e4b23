// The journey editor's form. The shared journey schemas it checks drafts with come in as a prop:
// they are loaded on demand (they carry the cron parser).
import { router } from 'expo-router';
import { useMemo, useState, type ReactNode } from 'react';
import { View } from 'react-native';
import type { HarImportAnswer } from '../../../hooks/queries/journey-views';
import { useDeleteJourneyMutation, useSaveJourneyMutation } from '../../../hooks/queries/journeys';
import { useSessionUser } from '../../../hooks/queries/session';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { isAdmin } from '../../auth/roles';
import type { JourneySchemas } from '../../forms/journey-schemas';
import { describeError } from '../../format/describe-error';
import { Checkbox } from '../../forms/checkbox';
import { FieldMessage } from '../../forms/field-message';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { Notice } from '../../ui/notice';
import { Text } from '../../ui/text';
import { checkDraft, checkSchedule, describePath, errorUnder, serverDraftErrors, type DraftErrors } from './check-draft';
import { newStep, type JourneyDraft, type StepDraft } from './draft';
import { EditorCautions } from './editor-cautions';
import { ScheduleField } from './schedule-field';
import { ServicesPicker } from './services-picker';
import { StepEditor } from './step-editor';
import { TryPanel } from './try-panel';
import { VantagePicker } from './vantage-picker';

export interface JourneyEditorFormProps {
  journeyId?: number;
  initial: JourneyDraft;
  imported?: HarImportAnswer;
  schemas: JourneySchemas;
}

export default function JourneyEditorForm({ journeyId, initial, imported, schemas }: JourneyEditorFormProps) {
  const theme = useTheme();
  const { isRoomy } = useBreakpoints();
  const admin = isAdmin(useSessionUser());
  const save = useSaveJourneyMutation();
  const [draft, setDraft] = useState<JourneyDraft>(initial);
  const [errors, setErrors] = useState<DraftErrors>({});
  const [problem, setProblem] = useState<string | null>(null);
  const schedule = useMemo(() => checkSchedule(schemas, draft), [draft.scheduleKind, draft.everySeconds, draft.cronExpression]); // eslint-disable-line react-hooks/exhaustive-deps

  const patch = (p: Partial<JourneyDraft>) => setDraft((d) => ({ ...d, ...p }));
  const setStep = (index: number, step: StepDraft) => setDraft((d) => ({ ...d, steps: d.steps.map((s, i) => (i === index ? step : s)) }));
  const moveStep = (index: number, by: -1 | 1) =>
    setDraft((d) => {
      const steps = [...d.steps];
      const [moved] = steps.splice(index, 1);
      steps.splice(index + by, 0, moved!);
      return { ...d, steps };
    });
  const removeStep = (index: number) => setDraft((d) => ({ ...d, steps: d.steps.filter((_, i) => i !== index) }));

  const submit = () => {
    setProblem(null);
    const checked = checkDraft(schemas, draft);
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    save.mutate(
      { id: journeyId, input: { document: checked.document, serviceIds: draft.serviceIds } },
      {
        onSuccess: (saved) => router.replace(`/journeys/${saved.id}`),
        onError: (error) => {
          const atField = serverDraftErrors(error);
          if (atField) setErrors(atField);
          setProblem(describeError(error));
        },
      },
    );
  };

  const basics = (
    <Card title="Journey" testID="journey-basics">
      <TextField label="Name" hint="What a customer is doing, such as Search and add to basket." value={draft.name} onChangeText={(name) => patch({ name })} error={errors.name} testID="journey-name" />
      <Checkbox
        label="Enabled"
        detail={draft.enabled ? 'Runs on its schedule once saved.' : 'Saved but not run until enabled.'}
        checked={draft.enabled}
        onChange={(enabled) => patch({ enabled })}
        testID="journey-enabled"
      />
    </Card>
  );
  const steps = (
    <Card title="Steps" description="Run in order; a run stops at the first failing step. Values captured by a step can be used by the steps after it." testID="journey-steps-editor">
      {draft.steps.map((step, index) => (
        <StepEditor
          key={step.key}
          step={step}
          index={index}
          count={draft.steps.length}
          onChange={(next) => setStep(index, next)}
          onMove={(by) => moveStep(index, by)}
          onRemove={() => removeStep(index)}
          errors={errors}
        />
      ))}
      {errors.steps ? <FieldMessage error={errors.steps} /> : null}
      <Button label="Add step" icon="plus" onPress={() => patch({ steps: [...draft.steps, newStep(draft.steps.length + 1)] })} testID="journey-add-step" />
    </Card>
  );
  const scheduleCard = (
    <Card title="Schedule" testID="journey-schedule">
      <ScheduleField draft={draft} onChange={patch} schedule={schedule} journeyId={journeyId} errors={errors} />
    </Card>
  );
  const vantages = (
    <Card title="Vantages" description="Where the journey runs from. Each chosen vantage runs every slot." testID="journey-vantages-card">
      <VantagePicker
        chosen={draft.vantages}
        quorum={draft.failureQuorum}
        onChosen={(vantages) => patch({ vantages })}
        onQuorum={(failureQuorum) => patch({ failureQuorum })}
        errors={errors}
        admin={admin}
      />
    </Card>
  );
  const services = <ServicesPicker chosen={draft.serviceIds} onChange={(serviceIds) => patch({ serviceIds })} error={errorUnder(errors, 'serviceIds')} />;
  const saveCard = <SaveCard journeyId={journeyId} errors={errors} problem={problem} busy={save.isPending} onSave={submit} />;
  const tryPanel = <TryPanel draft={draft} onErrors={setErrors} schemas={schemas} />;
  const importedNotice = imported ? <ImportedNotice imported={imported} /> : null;

  if (isRoomy) {
    return (
      <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.xl }}>
        <View style={{ flex: 1, gap: theme.space.xl }}>
          {importedNotice}
          {basics}
          {steps}
          {scheduleCard}
          {vantages}
          {services}
        </View>
        <View style={{ width: theme.sizes.editorAsideWidth, gap: theme.space.xl }}>
          <EditorCautions />
          {saveCard}
          {tryPanel}
        </View>
      </View>
    );
  }
  return (
    <View style={{ gap: theme.space.lg }}>
      <EditorCautions compact />
      {importedNotice}
      {basics}
      {steps}
      {scheduleCard}
      {vantages}
      {services}
      {tryPanel}
      {saveCard}
    </View>
  );
}

function ImportedNotice({ imported }: { imported: HarImportAnswer }) {
  const theme = useTheme();
  return (
    <Notice tone="info" title="Drafted from a HAR recording" testID="journey-imported">
      <View style={{ gap: theme.space.xs }}>
        <Text variant="small">Review every step, choose vantages and enable it when ready: a recording often holds more than a probe should repeat.</Text>
        {imported.secrets.length > 0 ? (
          <Text variant="small">
            {`Credentials found in the recording are stored as secrets: ${imported.secrets.map((s) => s.name).join(', ')}.`}
          </Text>
        ) : null}
        {imported.warnings.map((w) => (
          <Text key={w} variant="small" tone="muted">
            {w}
          </Text>
        ))}
      </View>
    </Notice>
  );
}

function SaveCard({
  journeyId,
  errors,
  problem,
  busy,
  onSave,
}: {
  journeyId?: number;
  errors: DraftErrors;
  problem: string | null;
  busy: boolean;
  onSave: () => void;
}) {
  const theme = useTheme();
  const remove = useDeleteJourneyMutation();
  const [confirming, setConfirming] = useState(false);
  const entries = Object.entries(errors);
  return (
    <Card testID="journey-save-card">
      {entries.length > 0 ? (
        <Notice tone="bad" title={entries.length === 1 ? 'One thing to fix' : `${entries.length} things to fix`} testID="journey-errors">
          <View style={{ gap: theme.space.xxs }}>
            {entries.map(([path, message]) => (
              <Text key={path} variant="small">
                <Text variant="smallStrong">{describePath(path)}</Text>
                {`: ${message}`}
              </Text>
            ))}
          </View>
        </Notice>
      ) : null}
      {problem && entries.length === 0 ? <Notice tone="bad">{problem}</Notice> : null}
      <Row>
        <Button label={journeyId ? 'Save as a new version' : 'Save journey'} kind="primary" icon="check" onPress={onSave} busy={busy} testID="journey-save" />
        <Button label="Cancel" kind="quiet" onPress={() => (journeyId ? router.replace(`/journeys/${journeyId}`) : router.replace('/journeys'))} testID="journey-cancel" />
      </Row>
      {journeyId ? (
        <Text variant="caption" tone="faint">
          Runs keep the version they ran; earlier versions stay readable.
        </Text>
      ) : null}
      {journeyId ? (
        confirming ? (
          <View style={{ gap: theme.space.sm }}>
            <Text variant="small">Delete this journey with all its versions and runs? This cannot be undone.</Text>
            <Row>
              <Button
                label="Delete journey"
                kind="danger"
                compact
                busy={remove.isPending}
                onPress={() => remove.mutate(journeyId, { onSuccess: () => router.replace('/journeys') })}
                testID="journey-delete-confirm"
              />
              <Button label="Keep it" kind="quiet" compact onPress={() => setConfirming(false)} testID="journey-delete-cancel" />
            </Row>
            {remove.isError ? <FieldMessage error={describeError(remove.error)} /> : null}
          </View>
        ) : (
          <Button label="Delete…" kind="danger" compact icon="trash-2" onPress={() => setConfirming(true)} testID="journey-delete" />
        )
      ) : null}
    </Card>
  );
}

function Row({ children }: { children: ReactNode }) {
  const theme = useTheme();
  return <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: theme.space.sm }}>{children}</View>;
}
