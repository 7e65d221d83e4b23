import { useState } from 'react';
import { View } from 'react-native';
import { useSessionUser } from '../../../hooks/queries/session';
import { useTokensQuery } from '../../../hooks/queries/tokens';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import type { CreatedToken } from '../../../shared/schemas/tokens';
import { NotAllowed } from '../../auth/not-allowed';
import { isAdmin } from '../../auth/roles';
import { describeError } from '../../format/describe-error';
import { useTheme } from '../../theme';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { SettingsPage } from '../settings-page';
import { CreateTokenForm } from './create-token-form';
import { TokenList } from './token-list';
import { TokenSecretPanel } from './token-secret-panel';

export function TokensScreen() {
  return (
    <SettingsPage
      title="Access tokens"
      description="Machines sign in with tokens: a service sending metrics, a pipeline recording releases, a script reading reports. Each token may do only what its scopes allow."
      testID="tokens-screen"
    >
      <TokensContent />
    </SettingsPage>
  );
}

function TokensContent() {
  const theme = useTheme();
  const user = useSessionUser();
  const admin = isAdmin(user);
  const { isWide, atLeastTablet } = useBreakpoints();
  const tokens = useTokensQuery({ enabled: admin });
  const [created, setCreated] = useState<CreatedToken | null>(null);

  if (!user) return null;
  if (!admin) return <NotAllowed role={user.role} what="Only admins create and revoke access tokens." />;

  const list = tokens.isPending ? (
    <Loading label="Loading tokens…" />
  ) : tokens.isError ? (
    <Notice tone="bad" title="Could not load tokens">
      {describeError(tokens.error, user.role)}
    </Notice>
  ) : (
    <TokenList tokens={tokens.data} viewerRole={user.role} wide={atLeastTablet} />
  );

  const create = created ? (
    <TokenSecretPanel created={created} onDone={() => setCreated(null)} />
  ) : (
    <CreateTokenForm viewerRole={user.role} onCreated={setCreated} />
  );

  // Wide: the list beside the form; narrower: the form first, then the list.
  if (isWide) {
    return (
      <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.xl }}>
        <View style={{ flex: 3 }}>{list}</View>
        <View style={{ flex: 2 }}>{create}</View>
      </View>
    );
  }
  return (
    <View style={{ gap: theme.space.xl }}>
      {create}
      {list}
    </View>
  );
}
