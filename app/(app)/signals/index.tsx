import { ServicesScreen } from '../../../components/signals/lazy-screens';

export default function SignalsRoute() {
  return <ServicesScreen />;
}
