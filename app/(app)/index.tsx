import { NowScreen } from '../../components/now/now-screen';

export default function NowRoute() {
  return <NowScreen />;
}
