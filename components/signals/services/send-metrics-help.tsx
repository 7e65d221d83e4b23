import type { ReactNode } from 'react';
import { View } from 'react-native';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { EmptyState } from '../../ui/empty-state';
import { Text } from '../../ui/text';
import { TextLink } from '../../ui/text-link';

const BATCH_EXAMPLE = `{"points": [{"service": "checkout", "signal": "http.requests",
  "kind": "counter", "labels": {"route": "/pay"},
  "t": "2026-12-01T09:30:00Z", "value": 1042}]}`;

/** The three ways metrics get in, said plainly, for an empty Signals place. */
export function SendMetricsHelp({ writer, admin }: { writer: boolean; admin: boolean }) {
  const theme = useTheme();
  const origin = typeof location === 'undefined' ? '' : location.origin;
  return (
    <Card testID="services-empty">
      <EmptyState
        title="No service has sent metrics yet"
        body="A service appears here with its signals as soon as its first sample arrives. Any of these ways works; each sample names its service."
      />
      <Way number={1} title="OpenTelemetry (OTLP over HTTP)">
        <Text variant="small">
          {'Point the OTLP metrics exporter (JSON or protobuf) at '}
          <Text variant="numberSmall">{`${origin}/v1/metrics`}</Text>
          {' and send the header '}
          <Text variant="numberSmall">Authorization: Bearer &lt;token&gt;</Text>
          {'. The token needs the "Send metrics" scope; '}
          {admin ? 'create one under Settings → Access tokens.' : 'an admin creates it under Settings → Access tokens.'}
        </Text>
        {admin ? <TextLink href="/settings/tokens" label="Go to Access tokens" variant="smallStrong" testID="services-tokens-link" /> : null}
      </Way>
      <Way number={2} title="Plain JSON from a script">
        <Text variant="small">
          {'POST a batch of up to 5 000 points to '}
          <Text variant="numberSmall">{`${origin}/api/signals/samples`}</Text>
          {' with the same kind of token:'}
        </Text>
        <View style={{ backgroundColor: theme.colors.sunken, borderRadius: theme.radii.md, padding: theme.space.md }}>
          <Text variant="numberSmall" selectable>
            {BATCH_EXAMPLE}
          </Text>
        </View>
      </Way>
      <Way number={3} title="A CSV file of past samples">
        <Text variant="small">
          {writer
            ? 'Upload a spreadsheet export: map its columns to time, value, signal and labels, and see which rows were refused and why.'
            : 'Engineers and admins upload spreadsheet exports of past samples.'}
        </Text>
        {writer ? <TextLink href="/signals/upload" label="Upload a CSV file" variant="smallStrong" testID="services-upload-link" /> : null}
      </Way>
      <Text variant="caption" tone="faint">
        A service that publishes its figures as a JSON document can also be collected on an interval: Settings → Collection targets.
      </Text>
    </Card>
  );
}

function Way({ number, title, children }: { number: number; title: string; children: ReactNode }) {
  const theme = useTheme();
  return (
    <View style={{ flexDirection: 'row', gap: theme.space.md }}>
      <Text variant="number" tone="muted" style={{ width: theme.sizes.ordinalColumn }}>
        {number}
      </Text>
      <View style={{ flex: 1, gap: theme.space.sm }}>
        <Text variant="bodyStrong">{title}</Text>
        {children}
      </View>
    </View>
  );
}
