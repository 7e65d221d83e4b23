import { PlaceEmptyScreen } from '../../components/places/place-empty-screen';

export default function JourneysRoute() {
  return <PlaceEmptyScreen place="journeys" />;
}
