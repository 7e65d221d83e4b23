import { JourneysFrame } from '../../../components/journeys/journeys-frame';

export default function JourneysLayout() {
  return <JourneysFrame />;
}
