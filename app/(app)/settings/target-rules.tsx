import { TargetRulesScreen } from '../../../components/settings/target-rules/target-rules-screen';

export default function TargetRulesRoute() {
  return <TargetRulesScreen />;
}
