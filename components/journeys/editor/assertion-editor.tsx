import type { ReactNode } from 'react';
import { View } from 'react-native';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { FieldMessage } from '../../forms/field-message';
import { SelectField } from '../../forms/select-field';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { IconButton } from '../../ui/icon-button';
import { errorUnder, type DraftErrors } from './check-draft';
import { ASSERTION_KINDS, JSON_OPS, type AssertionDraft, type AssertionKind, type JsonOp } from './draft';

const KIND_LABELS: Record<AssertionKind, string> = {
  status: 'Status is one of',
  latency: 'Answers within',
  'header-equals': 'Header equals',
  'header-matches': 'Header matches',
  'body-contains': 'Body contains',
  'body-matches': 'Body matches',
  json: 'JSON value',
};
const KIND_OPTIONS = ASSERTION_KINDS.map((value) => ({ value, label: KIND_LABELS[value] }));
const OP_LABELS: Record<JsonOp, string> = { eq: 'equals', ne: 'does not equal', lt: 'is less than', le: 'is at most', gt: 'is more than', ge: 'is at least', exists: 'exists' };
const OP_OPTIONS = JSON_OPS.map((value) => ({ value, label: OP_LABELS[value] }));

/** One check on a step's response, with the fields its kind needs. */
export function AssertionEditor({
  value,
  onChange,
  onRemove,
  path,
  errors,
  testID,
}: {
  value: AssertionDraft;
  onChange: (next: AssertionDraft) => void;
  onRemove: () => void;
  /** "steps.0.assertions.1" */
  path: string;
  errors: DraftErrors;
  testID: string;
}) {
  const theme = useTheme();
  const { atLeastTablet } = useBreakpoints();
  const set = <K extends keyof AssertionDraft>(key: K, v: AssertionDraft[K]) => onChange({ ...value, [key]: v });
  const at = (field: string) => errorUnder(errors, `${path}.${field}`);
  const cell = atLeastTablet ? { flex: 1, minWidth: theme.sizes.fieldMin } : undefined;

  let fields: ReactNode;
  switch (value.kind) {
    case 'status':
      fields = (
        <View style={cell}>
          <TextField label="Status codes" hint="Separate with commas: 200, 204" value={value.statuses} onChangeText={(v) => set('statuses', v)} error={at('in')} testID={`${testID}-status`} mono keyboardType="numbers-and-punctuation" />
        </View>
      );
      break;
    case 'latency':
      fields = (
        <View style={cell}>
          <TextField label="Under (ms)" value={value.underMs} onChangeText={(v) => set('underMs', v)} error={at('underMs')} testID={`${testID}-under`} mono keyboardType="number-pad" />
        </View>
      );
      break;
    case 'header-equals':
    case 'header-matches':
      fields = (
        <>
          <View style={cell}>
            <TextField label="Header" value={value.header} onChangeText={(v) => set('header', v)} error={at('header')} testID={`${testID}-header`} mono autoCapitalize="none" placeholder="content-type" />
          </View>
          {value.kind === 'header-equals' ? (
            <View style={cell}>
              <TextField label="Value" value={value.value} onChangeText={(v) => set('value', v)} error={at('value')} testID={`${testID}-value`} mono autoCapitalize="none" />
            </View>
          ) : (
            <Pattern value={value} set={set} at={at} testID={testID} cell={cell} />
          )}
        </>
      );
      break;
    case 'body-contains':
      fields = (
        <View style={cell}>
          <TextField label="Text" value={value.text} onChangeText={(v) => set('text', v)} error={at('text')} testID={`${testID}-text`} mono autoCapitalize="none" />
        </View>
      );
      break;
    case 'body-matches':
      fields = <Pattern value={value} set={set} at={at} testID={testID} cell={cell} />;
      break;
    case 'json':
      fields = (
        <>
          <View style={cell}>
            <TextField label="Path" hint="Such as $.items[0].id" value={value.path} onChangeText={(v) => set('path', v)} error={at('path')} testID={`${testID}-path`} mono autoCapitalize="none" />
          </View>
          <View style={cell}>
            <SelectField label="Comparison" accessibilityLabel="Comparison" value={value.op} options={OP_OPTIONS} onChange={(v) => set('op', v)} testID={`${testID}-op`} error={at('op')} />
          </View>
          {value.op === 'exists' ? null : (
            <View style={cell}>
              <TextField label="Value" hint='JSON: 42, true, "text"; plain words count as text' value={value.value} onChangeText={(v) => set('value', v)} error={at('value')} testID={`${testID}-value`} mono autoCapitalize="none" />
            </View>
          )}
        </>
      );
      break;
  }

  return (
    <View testID={testID} style={{ gap: theme.space.sm, paddingVertical: theme.space.sm }}>
      <View style={{ flexDirection: 'row', alignItems: 'flex-end', gap: theme.space.sm }}>
        <View style={{ flex: 1 }}>
          <SelectField label="Check" accessibilityLabel="Kind of check" value={value.kind} options={KIND_OPTIONS} onChange={(kind) => onChange({ ...value, kind })} testID={`${testID}-kind`} />
        </View>
        <IconButton icon="x" label="Remove this assertion" tone="bad" onPress={onRemove} testID={`${testID}-remove`} />
      </View>
      <View style={{ flexDirection: atLeastTablet ? 'row' : 'column', flexWrap: 'wrap', gap: theme.space.md }}>{fields}</View>
      {errors[path] ? <FieldMessage error={errors[path]} /> : null}
    </View>
  );
}

function Pattern({
  value,
  set,
  at,
  testID,
  cell,
}: {
  value: AssertionDraft;
  set: <K extends keyof AssertionDraft>(key: K, v: AssertionDraft[K]) => void;
  at: (field: string) => string | undefined;
  testID: string;
  cell: { flex: number; minWidth: number } | undefined;
}) {
  return (
    <>
      <View style={cell}>
        <TextField label="Pattern (regular expression)" value={value.pattern} onChangeText={(v) => set('pattern', v)} error={at('pattern')} testID={`${testID}-pattern`} mono autoCapitalize="none" />
      </View>
      <View style={cell}>
        <TextField label="Flags" hint="i, m and s" value={value.flags} onChangeText={(v) => set('flags', v)} error={at('flags')} testID={`${testID}-flags`} mono autoCapitalize="none" />
      </View>
    </>
  );
}
