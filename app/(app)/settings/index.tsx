import { SettingsHomeScreen } from '../../../components/settings/settings-home-screen';

export default function SettingsRoute() {
  return <SettingsHomeScreen />;
}
