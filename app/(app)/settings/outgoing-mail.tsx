import { OutgoingMailScreen } from '../../../components/settings/outgoing-mail/outgoing-mail-screen';

export default function OutgoingMailRoute() {
  return <OutgoingMailScreen />;
}
