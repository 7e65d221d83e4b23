import { useLocalSearchParams } from 'expo-router';
import { JourneyEditorScreen } from '../../../components/journeys/lazy-screens';

export default function NewJourneyRoute() {
  const { from } = useLocalSearchParams<{ from?: string }>();
  return <JourneyEditorScreen fromImport={from === 'har'} />;
}
