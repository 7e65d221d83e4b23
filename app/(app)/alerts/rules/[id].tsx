import { useLocalSearchParams } from 'expo-router';
import { NotFoundScreen } from '../../../../components/not-found-screen';
import { RuleEditorScreen } from '../../../../components/rules/rule-editor-screen';

export default function EditRuleRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  const n = Number(id);
  return Number.isInteger(n) && n > 0 ? <RuleEditorScreen id={n} /> : <NotFoundScreen />;
}
