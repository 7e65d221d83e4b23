import { View } from 'react-native';
import { useVantagesQuery } from '../../../hooks/queries/vantages';
import { describeError } from '../../format/describe-error';
import { Checkbox } from '../../forms/checkbox';
import { FieldMessage } from '../../forms/field-message';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { Loading } from '../../ui/loading';
import { StatusMark } from '../../ui/status-mark';
import { Text } from '../../ui/text';
import { TextLink } from '../../ui/text-link';
import { errorUnder, type DraftErrors } from './check-draft';

/** Where the journey runs from, and how many of those places must fail for a slot to fail. */
export function VantagePicker({
  chosen,
  quorum,
  onChosen,
  onQuorum,
  errors,
  admin,
}: {
  chosen: string[];
  quorum: string;
  onChosen: (next: string[]) => void;
  onQuorum: (next: string) => void;
  errors: DraftErrors;
  admin: boolean;
}) {
  const theme = useTheme();
  const vantages = useVantagesQuery();
  const known = vantages.data ?? [];
  // A chosen vantage that no longer exists stays listed so it can be unticked.
  const gone = chosen.filter((name) => !known.some((v) => v.name === name));
  const toggle = (name: string, on: boolean) => onChosen(on ? [...chosen, name] : chosen.filter((v) => v !== name));
  return (
    <View style={{ gap: theme.space.lg }}>
      <View testID="journey-vantages-field" style={{ gap: theme.space.xs }}>
        {vantages.isPending ? <Loading label="Loading vantages…" /> : null}
        {vantages.isError ? <Text variant="small" tone="bad">{describeError(vantages.error)}</Text> : null}
        {vantages.data && known.length === 0 ? (
          <Text variant="small" tone="muted">
            No vantages yet. A vantage is a worker started with that name.
          </Text>
        ) : null}
        {known.map((v) => (
          <View key={v.name} style={{ flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: theme.space.md }}>
            <View style={{ flexShrink: 1 }}>
              <Checkbox
                label={v.name}
                detail={v.region || undefined}
                checked={chosen.includes(v.name)}
                onChange={(on) => toggle(v.name, on)}
                testID={`journey-vantage-${v.name}`}
              />
            </View>
            <StatusMark tone={v.up ? 'good' : 'bad'} label={v.up ? 'Up' : 'Down'} />
          </View>
        ))}
        {gone.map((name) => (
          <Checkbox key={name} label={name} detail="No such vantage any more: untick it." checked onChange={() => toggle(name, false)} testID={`journey-vantage-${name}`} />
        ))}
        <FieldMessage error={errorUnder(errors, 'vantages')} />
        {admin ? <TextLink href="/settings/vantages" label="Manage vantages" variant="smallStrong" /> : null}
      </View>
      <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.md }}>
        <View style={{ width: theme.sizes.figureColumn * 1.5 }}>
          <TextField label="Failure quorum" value={quorum} onChangeText={onQuorum} error={errors.failureQuorum} testID="journey-quorum" mono keyboardType="number-pad" />
        </View>
        <Text variant="small" tone="muted" style={{ flex: 1, paddingTop: theme.space.xxl }}>
          {`of ${chosen.length} ${chosen.length === 1 ? 'vantage' : 'vantages'} must fail for a slot to count as failing. One vantage failing alone is often its own network.`}
        </Text>
      </View>
    </View>
  );
}
