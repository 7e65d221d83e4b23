import { StyleSheet, View } from 'react-native';
import { useTheme } from '../theme';
import { Text } from './text';

/**
 * A status is always a shape and a word, with colour as a third cue only:
 * good = filled circle, bad = filled diamond, caution = filled triangle,
 * missing = hollow dashed circle, off = hollow square.
 */
export type StatusTone = 'good' | 'bad' | 'caution' | 'missing' | 'off';

export function StatusShape({ tone, size }: { tone: StatusTone; size?: number }) {
  const theme = useTheme();
  const s = size ?? theme.sizes.mark;
  const c = theme.colors;
  switch (tone) {
    case 'good':
      return <View style={{ width: s, height: s, borderRadius: s / 2, backgroundColor: c.good }} />;
    case 'bad':
      return (
        <View style={{ width: s, height: s, alignItems: 'center', justifyContent: 'center' }}>
          <View
            style={{
              width: s * 0.78,
              height: s * 0.78,
              backgroundColor: c.bad,
              transform: [{ rotate: '45deg' }],
            }}
          />
        </View>
      );
    case 'caution':
      return (
        <View
          style={{
            width: 0,
            height: 0,
            borderLeftWidth: s / 2 + 1,
            borderRightWidth: s / 2 + 1,
            borderBottomWidth: s,
            borderLeftColor: 'transparent',
            borderRightColor: 'transparent',
            borderBottomColor: c.caution,
          }}
        />
      );
    case 'missing':
      return (
        <View
          style={{
            width: s,
            height: s,
            borderRadius: s / 2,
            borderWidth: theme.borders.strong,
            borderStyle: 'dashed',
            borderColor: c.missing,
          }}
        />
      );
    case 'off':
      return (
        <View
          style={{
            width: s,
            height: s,
            borderWidth: theme.borders.strong,
            borderColor: c.missing,
          }}
        />
      );
  }
}

export interface StatusMarkProps {
  tone: StatusTone;
  label: string;
  /** Filled chip behind the mark, for table cells that need more weight. */
  chip?: boolean;
  testID?: string;
}

export function StatusMark({ tone, label, chip = false, testID }: StatusMarkProps) {
  const theme = useTheme();
  const c = theme.colors;
  const textTone = tone === 'good' ? 'good' : tone === 'bad' ? 'bad' : tone === 'caution' ? 'caution' : 'muted';
  const wash = tone === 'good' ? c.goodWash : tone === 'bad' ? c.badWash : tone === 'caution' ? c.cautionWash : c.sunken;
  return (
    <View
      testID={testID}
      accessible
      accessibilityLabel={label}
      style={[
        styles.row,
        { gap: theme.space.sm },
        chip && {
          backgroundColor: wash,
          paddingHorizontal: theme.space.sm,
          paddingVertical: theme.space.xxs,
          borderRadius: theme.radii.pill,
        },
      ]}
    >
      <StatusShape tone={tone} />
      <Text variant="smallStrong" tone={textTone}>
        {label}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', alignSelf: 'flex-start' },
});
