import { useLocalSearchParams } from 'expo-router';
import { JourneyDetailScreen } from '../../../../components/journeys/lazy-screens';

export default function JourneyRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <JourneyDetailScreen key={id} id={Number(id)} />;
}
