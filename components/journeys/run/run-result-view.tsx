import { View } from 'react-native';
import type { RunResult } from '../../../shared/journey/run-result';
import { useTheme } from '../../theme';
import { Notice } from '../../ui/notice';
import { StepResultCard } from './step-result-card';

type Outcome = Pick<RunResult, 'verdict' | 'failedStep' | 'voidReason' | 'steps'> & { failureClass: string | null };

/**
 * The verdict in a sentence, then every step that ran. Shared by run detail and "Try it now";
 * `narrow` stacks each step's parts (a side column).
 */
export function RunResultView({ result, testID, narrow = false }: { result: Outcome; testID: string; narrow?: boolean }) {
  const theme = useTheme();
  return (
    <View testID={testID} style={{ gap: theme.space.lg }}>
      {result.verdict === 'void' ? (
        <Notice tone="info" title="Void: missing data, not a failure" testID={`${testID}-void`}>
          {`The runner could not run this slot${result.voidReason ? `: ${result.voidReason}` : ''}. It does not count against the pass rate.`}
        </Notice>
      ) : result.verdict === 'fail' ? (
        <Notice tone="bad" title={`Failed${result.failedStep !== null ? ` at step ${result.failedStep + 1}` : ''}${result.failureClass ? ` (${result.failureClass})` : ''}`}>
          The run stops at the first failing step; later steps did not run.
        </Notice>
      ) : (
        <Notice tone="good" title="Passed">
          {`All ${result.steps.length} ${result.steps.length === 1 ? 'step' : 'steps'} passed.`}
        </Notice>
      )}
      {result.steps.map((step) => (
        <StepResultCard key={step.index} step={step} testID={`${testID}-step-${step.index}`} narrow={narrow} />
      ))}
    </View>
  );
}
