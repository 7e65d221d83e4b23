import { useState, type ReactNode } from 'react';
import { View } from 'react-native';
import { useRevokeTokenMutation } from '../../../hooks/queries/tokens';
import { SCOPE_LABELS, type Role } from '../../../shared/roles';
import type { TokenView } from '../../../shared/schemas/tokens';
import { describeError } from '../../format/describe-error';
import { formatDate, formatRelative } from '../../format/time';
import { FieldMessage } from '../../forms/field-message';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { StatusMark } from '../../ui/status-mark';
import { Text } from '../../ui/text';

function ScopeTag({ label }: { label: string }) {
  const theme = useTheme();
  return (
    <View
      style={{
        borderWidth: theme.borders.hairline,
        borderColor: theme.colors.lineStrong,
        borderRadius: theme.radii.sm,
        paddingHorizontal: theme.space.sm,
        paddingVertical: theme.space.xxs,
      }}
    >
      <Text variant="caption">{label}</Text>
    </View>
  );
}

/** One token: what it may do, when it was made and last used, and the way to revoke it. */
export function TokenRow({ token, viewerRole, wide }: { token: TokenView; viewerRole: Role; wide: boolean }) {
  const theme = useTheme();
  const revoke = useRevokeTokenMutation();
  const [confirming, setConfirming] = useState(false);
  const revoked = token.revokedAt !== null;

  const facts = (
    <View style={{ flexDirection: 'row', flexWrap: 'wrap', columnGap: theme.space.xl, rowGap: theme.space.xs }}>
      <Fact label="Created">
        <Text variant="numberSmall">{formatDate(token.createdAt)}</Text>
        {token.createdBy ? <Text variant="small" tone="muted">{` by ${token.createdBy}`}</Text> : null}
      </Fact>
      <Fact label="Last used">
        <Text variant="numberSmall">{token.lastUsedAt ? formatRelative(token.lastUsedAt) : 'never'}</Text>
      </Fact>
      {revoked && token.revokedAt ? (
        <Fact label="Revoked">
          <Text variant="numberSmall">{formatDate(token.revokedAt)}</Text>
        </Fact>
      ) : null}
    </View>
  );

  const status = revoked ? <StatusMark tone="off" label="Revoked" /> : <StatusMark tone="good" label="Active" />;
  const revokeButton =
    revoked || confirming ? null : (
      <Button label="Revoke" kind="danger" compact onPress={() => setConfirming(true)} testID={`token-revoke-${token.id}`} />
    );

  return (
    <View testID={`token-row-${token.id}`} style={{ paddingVertical: theme.space.lg, gap: theme.space.md, opacity: revoked ? 0.75 : 1 }}>
      <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.md }}>
        <View style={{ flex: 1, gap: theme.space.sm }}>
          <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'baseline', columnGap: theme.space.md }}>
            <Text variant="bodyStrong">{token.name}</Text>
            <Text variant="numberSmall" tone="muted">{`${token.prefix}…`}</Text>
          </View>
          <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.sm }}>
            {token.scopes.map((scope) => (
              <ScopeTag key={scope} label={SCOPE_LABELS[scope]} />
            ))}
          </View>
          {facts}
        </View>
        <View style={{ alignItems: 'flex-end', gap: theme.space.md }}>
          {status}
          {wide ? revokeButton : null}
        </View>
      </View>
      {wide ? null : revokeButton}
      {confirming && !revoked ? (
        <View style={{ gap: theme.space.sm, alignItems: wide ? 'flex-end' : 'flex-start' }}>
          <Text variant="small">{`Revoke "${token.name}"? Anything using it is refused from now on. This cannot be undone.`}</Text>
          <View style={{ flexDirection: 'row', gap: theme.space.sm }}>
            <Button
              label="Revoke token"
              kind="danger"
              compact
              busy={revoke.isPending}
              onPress={() => revoke.mutate(token.id, { onSuccess: () => setConfirming(false) })}
              testID={`token-revoke-confirm-${token.id}`}
            />
            <Button label="Keep it" kind="quiet" compact onPress={() => setConfirming(false)} testID={`token-revoke-cancel-${token.id}`} />
          </View>
        </View>
      ) : null}
      {revoke.isError ? <FieldMessage error={describeError(revoke.error, viewerRole)} /> : null}
    </View>
  );
}

function Fact({ label, children }: { label: string; children: ReactNode }) {
  const theme = useTheme();
  return (
    <View style={{ flexDirection: 'row', alignItems: 'baseline', gap: theme.space.sm }}>
      <Text variant="small" tone="muted">
        {label}
      </Text>
      <Text>{children}</Text>
    </View>
  );
}
