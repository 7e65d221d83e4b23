import { MaintenanceScreen } from '../../../components/settings/maintenance/maintenance-screen';

export default function MaintenanceWindowsRoute() {
  return <MaintenanceScreen />;
}
