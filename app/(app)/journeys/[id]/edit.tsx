import { useLocalSearchParams } from 'expo-router';
import { JourneyEditorScreen } from '../../../../components/journeys/lazy-screens';

export default function EditJourneyRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <JourneyEditorScreen key={id} journeyId={Number(id)} />;
}
