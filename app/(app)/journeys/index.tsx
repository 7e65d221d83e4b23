import { JourneysScreen } from '../../../components/journeys/lazy-screens';

export default function JourneysRoute() {
  return <JourneysScreen />;
}
