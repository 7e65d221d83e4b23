import { AlertsScreen } from '../../../components/alerts/alerts-screen';

export default function AlertsRoute() {
  return <AlertsScreen />;
}
