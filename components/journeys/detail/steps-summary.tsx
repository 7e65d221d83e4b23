import { View } from 'react-native';
import type { JourneyDetail } from '../../../hooks/queries/journey-views';
import { formatDateTime } from '../../format/time';
import { SelectField } from '../../forms/select-field';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { Text } from '../../ui/text';

/** The steps of the version shown, and the way to look at an earlier version. */
export function StepsSummary({ journey, onVersion }: { journey: JourneyDetail; onVersion: (version: number | undefined) => void }) {
  const theme = useTheme();
  const current = journey.versions[0]?.version ?? journey.version;
  const options = journey.versions.map((v) => ({
    value: String(v.version),
    label: `Version ${v.version}${v.version === current ? ' (current)' : ''} · ${formatDateTime(v.createdAt)}${v.createdBy ? ` · ${v.createdBy}` : ''}`,
  }));
  return (
    <Card title="Steps" testID="journey-steps">
      {options.length > 1 ? (
        <SelectField
          label="Version"
          accessibilityLabel="Version to show"
          value={String(journey.version)}
          options={options}
          onChange={(v) => onVersion(Number(v) === current ? undefined : Number(v))}
          testID="journey-version"
          compact
        />
      ) : null}
      <View style={{ gap: theme.space.md }}>
        {journey.document.steps.map((step, index) => (
          <View key={index} style={{ flexDirection: 'row', gap: theme.space.md }}>
            <Text variant="numberSmall" tone="muted" style={{ width: theme.sizes.ordinalColumn }}>
              {index + 1}
            </Text>
            <View style={{ flex: 1, gap: theme.space.xxs }}>
              <Text variant="bodyStrong">{step.name}</Text>
              <Text variant="code" tone="muted" style={{ wordBreak: 'break-all' } as object}>
                {`${step.method} ${step.url}`}
              </Text>
              <Text variant="caption" tone="faint">
                {`${step.assertions.length} ${step.assertions.length === 1 ? 'assertion' : 'assertions'} · ${step.captures.length} ${step.captures.length === 1 ? 'capture' : 'captures'} · timeout ${step.timeoutMs} ms${step.followRedirects ? ' · follows redirects' : ''}`}
              </Text>
            </View>
          </View>
        ))}
      </View>
    </Card>
  );
}
