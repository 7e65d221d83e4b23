import { VantagesScreen } from '../../../components/settings/vantages/vantages-screen';

export default function VantagesRoute() {
  return <VantagesScreen />;
}
