import { RuleEditorScreen } from '../../../../components/rules/rule-editor-screen';

export default function NewRuleRoute() {
  return <RuleEditorScreen id={null} />;
}
