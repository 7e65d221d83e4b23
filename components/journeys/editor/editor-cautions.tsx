import { View } from 'react-native';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { StatusShape } from '../../ui/status-mark';
import { Text } from '../../ui/text';

// DESIGN.md §7: probes send real traffic.
const CAUTIONS = [
  { title: 'Respect rate limits', body: "Every run is real traffic. Keep the interval and the number of vantages within what the target's owners allow." },
  { title: 'No destructive steps in production without a test account', body: 'Steps that order, pay, delete or change data run against a test account made for probing, never a real customer.' },
  { title: 'Keep credentials in secrets', body: 'Write {{secret.NAME}} where a password or token goes. Secrets are encrypted at rest and never shown again.' },
  { title: 'Probe only with permission', body: 'Ask the owners before probing a system you do not run yourself.' },
] as const;

export function EditorCautions({ compact = false }: { compact?: boolean }) {
  const theme = useTheme();
  return (
    <Card title="Before a journey runs" testID="journey-cautions" style={{ borderColor: theme.colors.caution }}>
      <View style={{ gap: compact ? theme.space.sm : theme.space.md }}>
        {CAUTIONS.map((c) => (
          <View key={c.title} style={{ flexDirection: 'row', gap: theme.space.md }}>
            <View style={{ paddingTop: theme.sizes.markOffsetSmall }}>
              <StatusShape tone="caution" size={theme.sizes.markSmall} />
            </View>
            <View style={{ flex: 1, gap: theme.space.xxs }}>
              <Text variant="smallStrong">{c.title}</Text>
              {compact ? null : (
                <Text variant="small" tone="muted">
                  {c.body}
                </Text>
              )}
            </View>
          </View>
        ))}
      </View>
    </Card>
  );
}
