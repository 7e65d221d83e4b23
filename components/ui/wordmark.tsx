import { View } from 'react-native';
import { useTheme } from '../theme';
import { Text } from './text';

/** Two offset rings: the same thing seen from outside and from inside. */
export function ParallaxMark({ size = 22 }: { size?: number }) {
  const theme = useTheme();
  const ring = Math.round(size * 0.72);
  const stroke = Math.max(2, Math.round(size / 10));
  return (
    <View style={{ width: size, height: ring, justifyContent: 'center' }} accessibilityElementsHidden importantForAccessibility="no">
      <View
        style={{
          position: 'absolute',
          left: 0,
          width: ring,
          height: ring,
          borderRadius: ring / 2,
          borderWidth: stroke,
          borderColor: theme.colors.ink,
        }}
      />
      <View
        style={{
          position: 'absolute',
          left: size - ring,
          width: ring,
          height: ring,
          borderRadius: ring / 2,
          borderWidth: stroke,
          borderColor: theme.colors.accent,
        }}
      />
    </View>
  );
}

export function Wordmark({ size = 'medium' }: { size?: 'medium' | 'large' }) {
  const theme = useTheme();
  const large = size === 'large';
  return (
    <View
      accessible
      accessibilityRole="header"
      accessibilityLabel="Parallax"
      style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}
    >
      <ParallaxMark size={large ? 34 : 24} />
      <Text variant={large ? 'display' : 'heading'} style={{ letterSpacing: large ? 0.4 : 0.3 }}>
        Parallax
      </Text>
    </View>
  );
}
