import { View } from 'react-native';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { Checkbox } from '../../forms/checkbox';
import { FieldMessage } from '../../forms/field-message';
import { SelectField } from '../../forms/select-field';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Divider } from '../../ui/divider';
import { IconButton } from '../../ui/icon-button';
import { Text } from '../../ui/text';
import { AssertionEditor } from './assertion-editor';
import { CaptureEditor } from './capture-editor';
import { errorUnder, type DraftErrors } from './check-draft';
import { METHODS, newAssertion, newCapture, newHeader, type StepDraft } from './draft';

const METHOD_OPTIONS = METHODS.map((value) => ({ value, label: value }));

export interface StepEditorProps {
  step: StepDraft;
  index: number;
  count: number;
  onChange: (next: StepDraft) => void;
  onMove: (by: -1 | 1) => void;
  onRemove: () => void;
  errors: DraftErrors;
}

/** One HTTP request of the journey and what it checks and captures. */
export function StepEditor({ step, index, count, onChange, onMove, onRemove, errors }: StepEditorProps) {
  const theme = useTheme();
  const c = theme.colors;
  const { atLeastTablet } = useBreakpoints();
  const id = `step-${index}`;
  const path = `steps.${index}`;
  const at = (field: string) => errorUnder(errors, `${path}.${field}`);
  const set = <K extends keyof StepDraft>(key: K, value: StepDraft[K]) => onChange({ ...step, [key]: value });
  const bodyAllowed = step.method !== 'GET' && step.method !== 'HEAD';
  const row = { flexDirection: atLeastTablet ? 'row' : 'column', gap: theme.space.md } as const;

  return (
    <View
      testID={id}
      style={{ borderWidth: theme.borders.hairline, borderColor: c.lineStrong, borderRadius: theme.radii.lg, padding: theme.space.lg, gap: theme.space.lg, backgroundColor: c.paper }}
    >
      <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}>
        <Text variant="heading" style={{ flex: 1 }}>{`Step ${index + 1}`}</Text>
        <IconButton icon="arrow-up" label={`Move step ${index + 1} up`} disabled={index === 0} onPress={() => onMove(-1)} testID={`${id}-up`} />
        <IconButton icon="arrow-down" label={`Move step ${index + 1} down`} disabled={index === count - 1} onPress={() => onMove(1)} testID={`${id}-down`} />
        <IconButton icon="trash-2" label={`Remove step ${index + 1}`} tone="bad" disabled={count === 1} onPress={onRemove} testID={`${id}-remove`} />
      </View>
      <TextField label="Name" value={step.name} onChangeText={(v) => set('name', v)} error={at('name')} testID={`${id}-name`} />
      <View style={row}>
        <View style={atLeastTablet ? { width: theme.sizes.figureColumn * 1.4 } : undefined}>
          <SelectField label="Method" accessibilityLabel={`Method of step ${index + 1}`} value={step.method} options={METHOD_OPTIONS} onChange={(v) => set('method', v)} error={at('method')} testID={`${id}-method`} />
        </View>
        <View style={{ flex: 1 }}>
          <TextField
            label="URL"
            hint="{{name}} for a captured variable, {{secret.NAME}} for a secret"
            value={step.url}
            onChangeText={(v) => set('url', v)}
            error={at('url')}
            testID={`${id}-url`}
            mono
            autoCapitalize="none"
            keyboardType="url"
            placeholder="https://shop.example/api/search?q=tea"
          />
        </View>
      </View>

      <View style={{ gap: theme.space.sm }}>
        <Text variant="label">Headers</Text>
        {step.headers.length === 0 ? (
          <Text variant="small" tone="muted">
            None. The prober sends its own traceparent header with every request.
          </Text>
        ) : null}
        {step.headers.map((h, i) => (
          <View key={h.key} style={{ flexDirection: atLeastTablet ? 'row' : 'column', alignItems: atLeastTablet ? 'flex-end' : 'stretch', gap: theme.space.sm }}>
            <View style={atLeastTablet ? { flex: 1 } : undefined}>
              <TextField
                label={`Header ${i + 1} name`}
                value={h.name}
                onChangeText={(v) => set('headers', step.headers.map((x) => (x.key === h.key ? { ...x, name: v } : x)))}
                error={at(`headers.${i}.name`)}
                testID={`${id}-header-${i}-name`}
                mono
                autoCapitalize="none"
              />
            </View>
            <View style={atLeastTablet ? { flex: 2 } : undefined}>
              <TextField
                label="Value"
                value={h.value}
                onChangeText={(v) => set('headers', step.headers.map((x) => (x.key === h.key ? { ...x, value: v } : x)))}
                error={at(`headers.${i}.value`)}
                testID={`${id}-header-${i}-value`}
                mono
                autoCapitalize="none"
              />
            </View>
            <IconButton icon="x" label={`Remove header ${i + 1}`} tone="bad" onPress={() => set('headers', step.headers.filter((x) => x.key !== h.key))} testID={`${id}-header-${i}-remove`} />
          </View>
        ))}
        <Button label="Add header" icon="plus" compact kind="quiet" onPress={() => set('headers', [...step.headers, newHeader()])} testID={`${id}-add-header`} />
        <FieldMessage error={errors[`${path}.headers`]} />
      </View>

      {bodyAllowed || step.body !== '' ? (
        <TextField
          label="Body"
          hint="Sent as typed; set a content-type header to match."
          value={step.body}
          onChangeText={(v) => set('body', v)}
          error={at('body')}
          testID={`${id}-body`}
          mono
          multiline
          numberOfLines={4}
          autoCapitalize="none"
        />
      ) : null}

      <View style={row}>
        <View style={atLeastTablet ? { flex: 1 } : undefined}>
          <TextField label="Timeout (ms)" value={step.timeoutMs} onChangeText={(v) => set('timeoutMs', v)} error={at('timeoutMs')} testID={`${id}-timeout`} mono keyboardType="number-pad" />
        </View>
        <View style={atLeastTablet ? { flex: 1 } : undefined}>
          <Checkbox label="Follow redirects" detail="Otherwise a 3xx answer is the response." checked={step.followRedirects} onChange={(v) => set('followRedirects', v)} testID={`${id}-follow`} />
        </View>
        {step.followRedirects ? (
          <View style={atLeastTablet ? { flex: 1 } : undefined}>
            <TextField label="At most" hint="redirects" value={step.maxRedirects} onChangeText={(v) => set('maxRedirects', v)} error={at('maxRedirects')} testID={`${id}-max-redirects`} mono keyboardType="number-pad" />
          </View>
        ) : null}
      </View>

      <Divider />
      <View style={{ gap: theme.space.xs }}>
        <Text variant="label">Assertions</Text>
        {step.assertions.length === 0 ? (
          <Text variant="small" tone="muted">
            None yet: any response that arrives passes. Add at least a status check.
          </Text>
        ) : null}
        {step.assertions.map((a, i) => (
          <AssertionEditor
            key={a.key}
            value={a}
            onChange={(next) => set('assertions', step.assertions.map((x) => (x.key === a.key ? next : x)))}
            onRemove={() => set('assertions', step.assertions.filter((x) => x.key !== a.key))}
            path={`${path}.assertions.${i}`}
            errors={errors}
            testID={`${id}-assertion-${i}`}
          />
        ))}
        <Button label="Add assertion" icon="plus" compact onPress={() => set('assertions', [...step.assertions, newAssertion()])} testID={`${id}-add-assertion`} />
      </View>

      <View style={{ gap: theme.space.xs }}>
        <Text variant="label">Captures</Text>
        {step.captures.map((cap, i) => (
          <CaptureEditor
            key={cap.key}
            value={cap}
            onChange={(next) => set('captures', step.captures.map((x) => (x.key === cap.key ? next : x)))}
            onRemove={() => set('captures', step.captures.filter((x) => x.key !== cap.key))}
            path={`${path}.captures.${i}`}
            errors={errors}
            testID={`${id}-capture-${i}`}
          />
        ))}
        <Button label="Add capture" icon="plus" compact kind="quiet" onPress={() => set('captures', [...step.captures, newCapture()])} testID={`${id}-add-capture`} />
      </View>
      {errors[path] ? <FieldMessage error={errors[path]} /> : null}
    </View>
  );
}
