import { PlaceEmptyScreen } from '../../components/places/place-empty-screen';

export default function SignalsRoute() {
  return <PlaceEmptyScreen place="signals" />;
}
