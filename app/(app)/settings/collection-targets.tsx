import { CollectionTargetsScreen } from '../../../components/signals/lazy-screens';

export default function CollectionTargetsRoute() {
  return <CollectionTargetsScreen />;
}
