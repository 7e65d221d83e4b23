import { useRuleQuery } from '../../hooks/queries/rules';
import { describeError } from '../format/describe-error';
import { Loading } from '../ui/loading';
import { Notice } from '../ui/notice';
import { Screen } from '../ui/screen';
import { TextLink } from '../ui/text-link';
import { EMPTY_RULE_FORM, fromDocument } from './rule-form';
import { RuleEditorForm } from './rule-editor-form';

/** New rule (id null) or an existing one. */
export function RuleEditorScreen({ id }: { id: number | null }) {
  return (
    <Screen
      title={id === null ? 'New alert rule' : 'Edit alert rule'}
      description="A condition on a service's signals, held for a sustain time, with what the responder should check first."
      before={<TextLink href="/alerts/rules" label="‹ Rules" variant="smallStrong" testID="rule-editor-back" />}
      testID="rule-editor-screen"
    >
      {id === null ? <RuleEditorForm id={null} initial={EMPTY_RULE_FORM} /> : <ExistingRule id={id} />}
    </Screen>
  );
}

function ExistingRule({ id }: { id: number }) {
  const rule = useRuleQuery(id);
  if (rule.isPending) return <Loading label="Loading the rule…" />;
  if (rule.isError) return <Notice tone="bad">{describeError(rule.error)}</Notice>;
  return <RuleEditorForm key={`${id}-${rule.data.version}`} id={id} initial={fromDocument(rule.data.document)} />;
}
