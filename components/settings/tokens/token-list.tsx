import { View } from 'react-native';
import type { Role } from '../../../shared/roles';
import type { TokenView } from '../../../shared/schemas/tokens';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { EmptyState } from '../../ui/empty-state';
import { Text } from '../../ui/text';
import { TokenRow } from './token-row';

export function TokenList({ tokens, viewerRole, wide }: { tokens: TokenView[]; viewerRole: Role; wide: boolean }) {
  const theme = useTheme();
  // Tokens still in use first; revoked ones stay listed for the record.
  const ordered = [...tokens].sort((a, b) => Number(a.revokedAt !== null) - Number(b.revokedAt !== null));
  const active = tokens.filter((token) => token.revokedAt === null).length;
  return (
    <Card
      title="Tokens"
      aside={
        <Text variant="numberSmall" tone="muted">
          {`${active} active`}
        </Text>
      }
      testID="token-list"
    >
      {ordered.length === 0 ? (
        <EmptyState title="No tokens yet" body="Pipelines and services that send data to Parallax each need one. Create the first above." />
      ) : (
        <View>
          {ordered.map((token, index) => (
            <View key={token.id} style={index > 0 ? { borderTopWidth: theme.borders.hairline, borderTopColor: theme.colors.line } : undefined}>
              <TokenRow token={token} viewerRole={viewerRole} wide={wide} />
            </View>
          ))}
        </View>
      )}
    </Card>
  );
}
