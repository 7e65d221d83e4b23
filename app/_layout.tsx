import { AppProviders } from '../components/root/app-providers';
import { RootNavigator } from '../components/root/root-navigator';

export default function RootLayout() {
  return (
    <AppProviders>
      <RootNavigator />
    </AppProviders>
  );
}
