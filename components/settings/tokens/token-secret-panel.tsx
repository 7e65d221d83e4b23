import { useState } from 'react';
import { View } from 'react-native';
import type { CreatedToken } from '../../../shared/schemas/tokens';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Notice } from '../../ui/notice';
import { Text } from '../../ui/text';
import { copyText } from './copy-text';

/** The whole secret, once. It lives only in this component's state and is gone when dismissed. */
export function TokenSecretPanel({ created, onDone }: { created: CreatedToken; onDone: () => void }) {
  const theme = useTheme();
  const c = theme.colors;
  const [copy, setCopy] = useState<'idle' | 'copied' | 'failed'>('idle');
  return (
    <View
      testID="token-secret-panel"
      style={{
        backgroundColor: c.surface,
        borderColor: c.caution,
        borderWidth: theme.borders.strong,
        borderRadius: theme.radii.lg,
        padding: theme.space.xl,
        gap: theme.space.lg,
      }}
    >
      <Notice tone="caution" title="Copy this token now. It will not be shown again.">
        {`Parallax keeps only a hash of "${created.token.name}". If it is lost, revoke it and create another.`}
      </Notice>
      <View style={{ backgroundColor: c.sunken, borderRadius: theme.radii.md, padding: theme.space.lg }}>
        <Text variant="code" selectable testID="token-secret" style={{ wordBreak: 'break-all' } as object}>
          {created.secret}
        </Text>
      </View>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: theme.space.md }}>
        <Button
          label={copy === 'copied' ? 'Copied' : 'Copy token'}
          icon={copy === 'copied' ? 'check' : 'copy'}
          kind="primary"
          onPress={() => void copyText(created.secret).then((ok) => setCopy(ok ? 'copied' : 'failed'))}
          testID="token-copy"
        />
        <Button label="I have stored it" onPress={onDone} testID="token-secret-done" />
        {copy === 'failed' ? (
          <Text variant="small" tone="muted">
            This browser did not allow copying. Select the token and copy it by hand.
          </Text>
        ) : null}
      </View>
    </View>
  );
}
