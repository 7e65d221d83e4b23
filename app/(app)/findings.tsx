import { PlaceEmptyScreen } from '../../components/places/place-empty-screen';

export default function FindingsRoute() {
  return <PlaceEmptyScreen place="findings" />;
}
