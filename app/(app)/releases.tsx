import { PlaceEmptyScreen } from '../../components/places/place-empty-screen';

export default function ReleasesRoute() {
  return <PlaceEmptyScreen place="releases" />;
}
