import { useLocalSearchParams } from 'expo-router';
import { SignalExplorerScreen } from '../../../components/signals/lazy-screens';

export default function SignalExplorerRoute() {
  const params = useLocalSearchParams<Record<string, string | string[]>>();
  return <SignalExplorerScreen params={params} />;
}
