import { SettingsFrame } from '../../../components/settings/settings-frame';

export default function SettingsLayout() {
  return <SettingsFrame />;
}
