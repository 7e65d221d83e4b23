import { TokensScreen } from '../../../components/settings/tokens/tokens-screen';

export default function TokensRoute() {
  return <TokensScreen />;
}
