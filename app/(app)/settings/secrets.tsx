import { SecretsScreen } from '../../../components/settings/secrets/secrets-screen';

export default function SecretsRoute() {
  return <SecretsScreen />;
}
