import type { ReactNode } from 'react';
import { View } from 'react-native';
import type { StepResult } from '../../../shared/journey/run-result';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { Notice } from '../../ui/notice';
import { StatusMark } from '../../ui/status-mark';
import { Text } from '../../ui/text';
import { AssertionOutcomes } from './assertion-outcomes';
import { TimingWaterfall } from './timing-waterfall';

// Captured values can hold anything a response carried (tokens, ids of real customers): the
// screen shows that a value was captured, never the value.
const MASK = '••••';

/** Everything one step of a run (or a "try it now") produced. */
export function StepResultCard({ step, testID, narrow = false }: { step: StepResult; testID: string; narrow?: boolean }) {
  const theme = useTheme();
  const { isWide } = useBreakpoints();
  const captures = Object.keys(step.captures);
  const mark = <StatusMark tone={step.passed ? 'good' : 'bad'} label={step.passed ? 'Pass' : 'Fail'} chip testID={`${testID}-verdict`} />;

  const timing = (
    <Section title="Timing">
      <TimingWaterfall timings={step.timings} redirected={step.redirects.length > 0} testID={`${testID}-waterfall`} />
    </Section>
  );
  const checks = (
    <Section title="Assertions">
      <AssertionOutcomes outcomes={step.assertions} testID={`${testID}-assertions`} />
    </Section>
  );

  return (
    <Card testID={testID}>
      <View style={{ flexDirection: 'row', alignItems: 'flex-start', justifyContent: 'space-between', gap: theme.space.md }}>
        <View style={{ flex: 1, gap: theme.space.xxs }}>
          <Text variant="heading">{`${step.index + 1}. ${step.name}`}</Text>
          <Text variant="code" tone="muted" selectable style={{ wordBreak: 'break-all' } as object}>
            {`${step.method} ${step.url}`}
          </Text>
        </View>
        <View style={{ alignItems: 'flex-end', gap: theme.space.xs }}>
          {mark}
          <Text variant="numberSmall" tone="muted">
            {step.httpStatus !== null ? `HTTP ${step.httpStatus}` : 'no response'}
          </Text>
        </View>
      </View>
      {step.error ? (
        <Notice tone="bad" title={step.failureClass ? `Failed: ${step.failureClass}` : 'Failed'}>
          {step.error}
        </Notice>
      ) : null}
      {isWide && !narrow ? (
        <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.xl }}>
          <View style={{ flex: 1 }}>{timing}</View>
          <View style={{ flex: 1 }}>{checks}</View>
        </View>
      ) : (
        <>
          {timing}
          {checks}
        </>
      )}
      {step.redirects.length > 0 ? (
        <Section title="Redirects followed">
          {step.redirects.map((r, i) => (
            <Text key={i} variant="code" selectable style={{ wordBreak: 'break-all' } as object}>
              {`${r.status} → ${r.location}`}
            </Text>
          ))}
        </Section>
      ) : null}
      {captures.length > 0 ? (
        <Section title="Captured variables">
          <View testID={`${testID}-captures`} style={{ gap: theme.space.xs }}>
            {captures.map((name) => (
              <View key={name} style={{ flexDirection: 'row', gap: theme.space.md }}>
                <Text variant="code">{name}</Text>
                <Text variant="code" tone="muted" accessibilityLabel="value hidden" testID={`${testID}-capture-${name}`}>
                  {MASK}
                </Text>
              </View>
            ))}
            <Text variant="caption" tone="faint">
              Values are hidden: they may hold credentials or customer data.
            </Text>
          </View>
        </Section>
      ) : null}
      {step.responseExcerpt ? (
        <Section title="Response excerpt">
          <View style={{ backgroundColor: theme.colors.sunken, borderRadius: theme.radii.md, padding: theme.space.md }}>
            <Text variant="code" selectable testID={`${testID}-excerpt`} style={{ wordBreak: 'break-all', whiteSpace: 'pre-wrap' } as object}>
              {step.responseExcerpt}
            </Text>
          </View>
          <Text variant="caption" tone="faint">
            The start of the body, with secrets replaced.
          </Text>
        </Section>
      ) : null}
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'baseline', columnGap: theme.space.sm }}>
        <Text variant="small" tone="muted">
          Trace id
        </Text>
        <Text variant="numberSmall" selectable testID={`${testID}-trace`}>
          {step.traceId}
        </Text>
      </View>
    </Card>
  );
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  const theme = useTheme();
  return (
    <View style={{ gap: theme.space.sm }}>
      <Text variant="label" tone="muted">
        {title}
      </Text>
      {children}
    </View>
  );
}
