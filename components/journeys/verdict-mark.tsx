import type { Verdict } from '../../shared/journey/run-result';
import { StatusMark, StatusShape, type StatusTone } from '../ui/status-mark';

// pass: filled circle; fail: filled diamond; void: hollow dashed circle, because a void run is
// missing data (the runner could not run it), never a failure of the target.
export const VERDICT_TONES: Record<Verdict, StatusTone> = { pass: 'good', fail: 'bad', void: 'missing' };
export const VERDICT_LABELS: Record<Verdict, string> = { pass: 'Pass', fail: 'Fail', void: 'Void' };
export const VERDICT_MEANINGS: Record<Verdict, string> = {
  pass: 'every step passed',
  fail: 'the target misbehaved',
  void: 'missing data: the runner could not run it',
};

export function VerdictMark({ verdict, chip = false, testID }: { verdict: Verdict; chip?: boolean; testID?: string }) {
  return <StatusMark tone={VERDICT_TONES[verdict]} label={VERDICT_LABELS[verdict]} chip={chip} testID={testID} />;
}

export function VerdictShape({ verdict, size }: { verdict: Verdict; size?: number }) {
  return <StatusShape tone={VERDICT_TONES[verdict]} size={size} />;
}
