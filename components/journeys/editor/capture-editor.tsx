import { View } from 'react-native';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { FieldMessage } from '../../forms/field-message';
import { SelectField } from '../../forms/select-field';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { IconButton } from '../../ui/icon-button';
import { errorUnder, type DraftErrors } from './check-draft';
import { CAPTURE_SOURCES, type CaptureDraft, type CaptureSource } from './draft';

const SOURCE_LABELS: Record<CaptureSource, string> = { json: 'From a JSON path', header: 'From a header', regex: 'From a regular expression' };
const SOURCE_OPTIONS = CAPTURE_SOURCES.map((value) => ({ value, label: SOURCE_LABELS[value] }));

/** One value taken from a step's response into a variable that later steps use as {{name}}. */
export function CaptureEditor({
  value,
  onChange,
  onRemove,
  path,
  errors,
  testID,
}: {
  value: CaptureDraft;
  onChange: (next: CaptureDraft) => void;
  onRemove: () => void;
  path: string;
  errors: DraftErrors;
  testID: string;
}) {
  const theme = useTheme();
  const { atLeastTablet } = useBreakpoints();
  const set = <K extends keyof CaptureDraft>(key: K, v: CaptureDraft[K]) => onChange({ ...value, [key]: v });
  const at = (field: string) => errorUnder(errors, `${path}.${field}`);
  const cell = atLeastTablet ? { flex: 1, minWidth: theme.sizes.fieldMin } : undefined;
  return (
    <View testID={testID} style={{ gap: theme.space.sm, paddingVertical: theme.space.sm }}>
      <View style={{ flexDirection: 'row', alignItems: 'flex-end', gap: theme.space.sm }}>
        <View style={{ flex: 1 }}>
          <SelectField label="Capture" accessibilityLabel="Where the value comes from" value={value.from} options={SOURCE_OPTIONS} onChange={(from) => onChange({ ...value, from })} testID={`${testID}-from`} />
        </View>
        <IconButton icon="x" label="Remove this capture" tone="bad" onPress={onRemove} testID={`${testID}-remove`} />
      </View>
      <View style={{ flexDirection: atLeastTablet ? 'row' : 'column', flexWrap: 'wrap', gap: theme.space.md }}>
        <View style={cell}>
          <TextField label="Variable name" hint={value.name ? `Later steps use {{${value.name}}}` : 'Later steps use it as {{name}}'} value={value.name} onChangeText={(v) => set('name', v)} error={at('name')} testID={`${testID}-name`} mono autoCapitalize="none" />
        </View>
        {value.from === 'json' ? (
          <View style={cell}>
            <TextField label="Path" hint="Such as $.token" value={value.path} onChangeText={(v) => set('path', v)} error={at('path')} testID={`${testID}-path`} mono autoCapitalize="none" />
          </View>
        ) : null}
        {value.from === 'header' ? (
          <>
            <View style={cell}>
              <TextField label="Header" value={value.header} onChangeText={(v) => set('header', v)} error={at('header')} testID={`${testID}-header`} mono autoCapitalize="none" placeholder="set-cookie" />
            </View>
            <View style={cell}>
              <TextField label="Keep only (optional pattern)" hint="Its first group is kept" value={value.pattern} onChangeText={(v) => set('pattern', v)} error={at('pattern')} testID={`${testID}-pattern`} mono autoCapitalize="none" />
            </View>
          </>
        ) : null}
        {value.from === 'regex' ? (
          <>
            <View style={cell}>
              <TextField label="Pattern (on the body)" value={value.pattern} onChangeText={(v) => set('pattern', v)} error={at('pattern')} testID={`${testID}-pattern`} mono autoCapitalize="none" />
            </View>
            <View style={cell}>
              <TextField label="Flags" hint="i, m and s" value={value.flags} onChangeText={(v) => set('flags', v)} error={at('flags')} testID={`${testID}-flags`} mono autoCapitalize="none" />
            </View>
            <View style={cell}>
              <TextField label="Group" value={value.group} onChangeText={(v) => set('group', v)} error={at('group')} testID={`${testID}-group`} mono keyboardType="number-pad" />
            </View>
          </>
        ) : null}
      </View>
      {errors[path] ? <FieldMessage error={errors[path]} /> : null}
    </View>
  );
}
