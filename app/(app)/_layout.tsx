import { AppTabs } from '../../components/navigation/app-tabs';

export default function AppLayout() {
  return <AppTabs />;
}
