import { View } from 'react-native';
import type { VantageStateView } from '../../../hooks/queries/journey-views';
import { useVantagesQuery } from '../../../hooks/queries/vantages';
import { formatRelative } from '../../format/time';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { StatusMark } from '../../ui/status-mark';
import { Text } from '../../ui/text';
import { VerdictMark } from '../verdict-mark';

/** Per vantage: is its worker alive, and what did its last run of this journey say. */
export function VantageStates({ vantages, states, quorum }: { vantages: string[]; states: VantageStateView[]; quorum: number }) {
  const theme = useTheme();
  const live = useVantagesQuery();
  // Vantages that ran an older version but are no longer chosen still show their last verdict.
  const names = [...vantages, ...states.map((s) => s.vantage).filter((v) => !vantages.includes(v))];
  return (
    <Card
      title="Vantages"
      description={`A slot counts as failing when ${quorum} of ${vantages.length} ${vantages.length === 1 ? 'vantage fails' : 'vantages fail'}.`}
      testID="journey-vantages"
    >
      <View style={{ gap: theme.space.md }}>
        {names.map((name) => {
          const state = states.find((s) => s.vantage === name);
          const worker = live.data?.find((v) => v.name === name);
          return (
            <View
              key={name}
              testID={`vantage-state-${name}`}
              style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: theme.space.md }}
            >
              <View style={{ flexShrink: 1, gap: theme.space.xxs }}>
                <Text variant="bodyStrong">{name}</Text>
                <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}>
                  {worker ? (
                    <StatusMark tone={worker.up ? 'good' : 'bad'} label={worker.up ? 'Worker up' : 'Worker down'} />
                  ) : live.data ? (
                    <StatusMark tone="off" label="Not a vantage any more" />
                  ) : null}
                  {worker?.region ? (
                    <Text variant="small" tone="muted">
                      {worker.region}
                    </Text>
                  ) : null}
                </View>
              </View>
              <View style={{ alignItems: 'flex-end', gap: theme.space.xxs }}>
                {state ? (
                  <>
                    <VerdictMark verdict={state.verdict} chip />
                    <Text variant="numberSmall" tone="muted">
                      {formatRelative(state.slotAt)}
                    </Text>
                  </>
                ) : (
                  <StatusMark tone="off" label="No runs yet" />
                )}
                {vantages.includes(name) ? null : (
                  <Text variant="caption" tone="faint">
                    no longer chosen
                  </Text>
                )}
              </View>
            </View>
          );
        })}
      </View>
    </Card>
  );
}
