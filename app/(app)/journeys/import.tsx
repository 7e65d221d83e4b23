import { HarImportScreen } from '../../../components/journeys/lazy-screens';

export default function ImportHarRoute() {
  return <HarImportScreen />;
}
