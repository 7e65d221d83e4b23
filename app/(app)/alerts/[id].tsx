import { useLocalSearchParams } from 'expo-router';
import { AlertDetailScreen } from '../../../components/alerts/alert-detail-screen';
import { NotFoundScreen } from '../../../components/not-found-screen';

export default function AlertDetailRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  const n = Number(id);
  return Number.isInteger(n) && n > 0 ? <AlertDetailScreen id={n} /> : <NotFoundScreen />;
}
