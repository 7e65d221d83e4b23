import { PlaceEmptyScreen } from '../../components/places/place-empty-screen';

export default function AlertsRoute() {
  return <PlaceEmptyScreen place="alerts" />;
}
