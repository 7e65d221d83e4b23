import { PeopleScreen } from '../../../components/settings/people/people-screen';

export default function PeopleRoute() {
  return <PeopleScreen />;
}
