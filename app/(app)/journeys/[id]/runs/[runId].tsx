import { useLocalSearchParams } from 'expo-router';
import { RunDetailScreen } from '../../../../../components/journeys/lazy-screens';

export default function RunRoute() {
  const { id, runId } = useLocalSearchParams<{ id: string; runId: string }>();
  return <RunDetailScreen key={runId} journeyId={Number(id)} runId={Number(runId)} />;
}
