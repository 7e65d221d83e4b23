import { Link } from 'expo-router';
import { Pressable, View } from 'react-native';
import { useSignalsQuery } from '../../../hooks/queries/signals';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import type { ServiceView, SignalView } from '../../../shared/schemas/signals';
import { describeError } from '../../format/describe-error';
import { formatRelative } from '../../format/time';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { Icon } from '../../ui/icon';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { StatusMark } from '../../ui/status-mark';
import { Text } from '../../ui/text';
import { explorerHref } from '../explorer/explorer-params';
import { unitLabel } from '../format-value';
import { KindTag } from '../kind-tag';

/** One service: when it last reported, and each of its signals with a way into the explorer. */
export function ServiceCard({ service }: { service: ServiceView }) {
  const theme = useTheme();
  const about = [service.description, service.owner ? `Owner: ${service.owner}` : ''].filter(Boolean).join(' · ');
  return (
    <Card
      title={service.name}
      description={about || undefined}
      aside={
        service.lastSampleAt ? (
          <Text variant="numberSmall" tone="muted" testID={`service-last-sample-${service.name}`}>
            {formatRelative(service.lastSampleAt)}
          </Text>
        ) : (
          <StatusMark tone="missing" label="No samples yet" />
        )
      }
      testID={`service-card-${service.name}`}
    >
      <Text variant="small" tone="muted">
        <Text variant="numberSmall" tone="muted">
          {service.signalCount}
        </Text>
        {service.signalCount === 1 ? ' signal, ' : ' signals, '}
        <Text variant="numberSmall" tone="muted">
          {service.seriesCount}
        </Text>
        {' series'}
      </Text>
      <View style={{ gap: theme.space.xs }}>
        <SignalList service={service.name} />
      </View>
    </Card>
  );
}

function SignalList({ service }: { service: string }) {
  const theme = useTheme();
  const { atLeastTablet } = useBreakpoints();
  const signals = useSignalsQuery(service);
  if (signals.isPending) return <Loading label="Loading signals…" />;
  if (signals.isError) return <Notice tone="bad">{describeError(signals.error)}</Notice>;
  if (signals.data.length === 0) {
    return (
      <Text variant="small" tone="muted">
        Named, but no signal has arrived for it yet.
      </Text>
    );
  }
  return (
    <View accessibilityRole="list" style={{ borderTopWidth: theme.borders.hairline, borderTopColor: theme.colors.line }}>
      {atLeastTablet ? (
        <View style={{ flexDirection: 'row', gap: theme.space.lg, paddingVertical: theme.space.sm, paddingHorizontal: theme.space.sm, borderBottomWidth: theme.borders.hairline, borderBottomColor: theme.colors.line }}>
          <ColumnHeader label="Signal" flex={3} />
          <ColumnHeader label="Labels" flex={3} />
          <ColumnHeader label="Series" flex={1} />
          <ColumnHeader label="Unit" flex={1} />
          <ColumnHeader label="Last sample" flex={1} />
          <View style={{ width: theme.sizes.iconSm }} />
        </View>
      ) : null}
      {signals.data.map((signal) => (
        <View key={signal.id} style={{ borderBottomWidth: theme.borders.hairline, borderBottomColor: theme.colors.line }}>
          <SignalRow signal={signal} />
        </View>
      ))}
    </View>
  );
}

function SignalRow({ signal }: { signal: SignalView }) {
  const theme = useTheme();
  const c = theme.colors;
  const { atLeastTablet } = useBreakpoints();
  const unit = unitLabel(signal.unit);
  const labels = signal.labelKeys.length ? signal.labelKeys.join(', ') : 'no labels';
  const last = signal.lastSampleAt ? formatRelative(signal.lastSampleAt) : 'never';
  return (
    <Link href={explorerHref(signal.service, signal.name)} asChild>
      <Pressable
        testID={`signal-row-${signal.service}-${signal.name}`}
        accessibilityRole="link"
        accessibilityLabel={`${signal.name}, ${signal.kind}: open in the explorer`}
        // A plain style object: Link's asChild cannot pass a style function through.
        style={{
          flexDirection: atLeastTablet ? 'row' : 'column',
          alignItems: atLeastTablet ? 'center' : 'stretch',
          gap: atLeastTablet ? theme.space.lg : theme.space.xs,
          paddingVertical: theme.space.md,
          paddingHorizontal: theme.space.sm,
        }}
      >
        <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.md, flex: atLeastTablet ? 3 : undefined }}>
          <Text variant="code" tone="accent" numberOfLines={1} style={{ flexShrink: 1 }}>
            {signal.name}
          </Text>
          <KindTag kind={signal.kind} />
        </View>
        {atLeastTablet ? (
          <>
            <Text variant="small" tone="muted" numberOfLines={1} style={{ flex: 3 }}>
              {labels}
            </Text>
            <Text variant="numberSmall" tone="muted" style={{ flex: 1 }}>
              {signal.seriesCount}
            </Text>
            <Text variant="numberSmall" tone="muted" style={{ flex: 1 }}>
              {unit || '—'}
            </Text>
            <Text variant="numberSmall" tone="muted" style={{ flex: 1 }}>
              {last}
            </Text>
            <Icon name="chevron-right" size={theme.sizes.iconSm} color={c.inkFaint} />
          </>
        ) : (
          <Text variant="small" tone="muted">
            {[unit ? `unit ${unit}` : '', `${signal.seriesCount} series`, `labels: ${labels}`].filter(Boolean).join(' · ')}
            {' · last '}
            <Text variant="numberSmall" tone="muted">
              {last}
            </Text>
          </Text>
        )}
      </Pressable>
    </Link>
  );
}

function ColumnHeader({ label, flex }: { label: string; flex: number }) {
  return (
    <Text variant="label" tone="muted" style={{ flex }}>
      {label}
    </Text>
  );
}
