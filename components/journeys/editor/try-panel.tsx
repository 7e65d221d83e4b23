import { useEffect, useState } from 'react';
import { View } from 'react-native';
import { isApiError } from '../../../hooks/api-client';
import { useTryJourneyMutation } from '../../../hooks/queries/journeys';
import { useVantagesQuery } from '../../../hooks/queries/vantages';
import { describeError } from '../../format/describe-error';
import { formatMs } from '../../format/duration';
import type { JourneySchemas } from '../../forms/journey-schemas';
import { SelectField } from '../../forms/select-field';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { Notice } from '../../ui/notice';
import { Text } from '../../ui/text';
import { RunResultView } from '../run/run-result-view';
import { checkDraftForTry, serverDraftErrors, type DraftErrors } from './check-draft';
import type { JourneyDraft } from './draft';

/** Plain words for why a try did not come back. */
function tryProblem(error: unknown, vantage: string): string {
  if (isApiError(error)) {
    // 503: the vantage is silent or slow; the server's sentence names it.
    if (error.status === 503) return error.message || `Vantage ${vantage} is down or did not answer in time.`;
    if (error.status === 502) return `Vantage ${vantage} could not run the draft (its worker reported an error).`;
  }
  return describeError(error);
}

/** "Try it now": runs the draft once from a chosen vantage; nothing is saved or scheduled. */
export function TryPanel({ draft, onErrors, schemas }: { draft: JourneyDraft; onErrors: (errors: DraftErrors) => void; schemas: JourneySchemas }) {
  const theme = useTheme();
  const vantages = useVantagesQuery();
  const tryIt = useTryJourneyMutation();
  const [vantage, setVantage] = useState('');
  const [problem, setProblem] = useState<string | null>(null);

  // Default to a chosen vantage that is up, else any that is up.
  useEffect(() => {
    if (vantage || !vantages.data?.length) return;
    const up = vantages.data.filter((v) => v.up);
    const pick = up.find((v) => draft.vantages.includes(v.name)) ?? up[0] ?? vantages.data[0];
    if (pick) setVantage(pick.name);
  }, [vantages.data, vantage, draft.vantages]);

  const options = (vantages.data ?? []).map((v) => ({ value: v.name, label: `${v.name} (${v.up ? 'up' : 'down'})` }));
  const chosen = vantages.data?.find((v) => v.name === vantage);

  const run = () => {
    setProblem(null);
    const checked = checkDraftForTry(schemas, draft, vantage);
    if (!checked.ok) {
      onErrors(checked.errors);
      setProblem('Fix the marked fields first; the draft is checked before it runs.');
      return;
    }
    onErrors({});
    tryIt.mutate(
      { document: checked.document, vantage },
      {
        onError: (error) => {
          const atField = serverDraftErrors(error);
          if (atField) onErrors(atField);
          setProblem(tryProblem(error, vantage));
        },
      },
    );
  };

  const result = tryIt.data?.result;
  return (
    <Card title="Try it now" description="Runs this draft once from one vantage and shows every step. Nothing is saved and no scheduled run is recorded." testID="journey-try-panel">
      {options.length === 0 ? (
        <Text variant="small" tone="muted">
          {vantages.isPending ? 'Loading vantages…' : 'No vantage to run from yet.'}
        </Text>
      ) : (
        <SelectField label="From" accessibilityLabel="Vantage to try from" value={vantage} options={options} onChange={setVantage} testID="journey-try-vantage" />
      )}
      {chosen && !chosen.up ? (
        <Notice tone="caution" title={`${chosen.name} is down`}>
          Its worker has stopped sending heartbeats, so it cannot run the draft. Choose another vantage or start its worker.
        </Notice>
      ) : null}
      <Button
        label={tryIt.isPending ? 'Running…' : 'Try it now'}
        icon="play"
        onPress={run}
        busy={tryIt.isPending}
        disabled={!vantage}
        testID="journey-try"
        accessibilityHint="Runs the draft once; it may take a few seconds"
      />
      {tryIt.isPending ? (
        <Text variant="small" tone="muted">
          {`Waiting for ${vantage}; each step may take up to its timeout.`}
        </Text>
      ) : null}
      {problem ? (
        <Notice tone="bad" title="The try did not run" testID="journey-try-problem">
          {problem}
        </Notice>
      ) : null}
      {result && !tryIt.isPending && !problem ? (
        <View style={{ gap: theme.space.md }}>
          <Text variant="small" tone="muted">
            {`From ${result.vantage}, took `}
            <Text variant="numberSmall" tone="muted">
              {formatMs(result.durationMs)}
            </Text>
          </Text>
          <RunResultView result={result} testID="try-result" narrow />
        </View>
      ) : null}
    </Card>
  );
}
