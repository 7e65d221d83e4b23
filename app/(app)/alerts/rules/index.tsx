import { RulesScreen } from '../../../../components/rules/rules-screen';

export default function RulesRoute() {
  return <RulesScreen />;
}
