import { Pressable, ScrollView, View } from 'react-native';
import { useSignalsQuery } from '../../../hooks/queries/signals';
import type { ServiceView } from '../../../shared/schemas/signals';
import { useTheme } from '../../theme';
import { Icon } from '../../ui/icon';
import { Loading } from '../../ui/loading';
import { Text } from '../../ui/text';
import { TextLink } from '../../ui/text-link';
import { KIND_LABELS } from '../kind-tag';

/** Wide screens: every service, the chosen one opened to its signals, beside the chart. */
export function SignalPane({
  services,
  service,
  signal,
  onService,
  onSignal,
}: {
  services: readonly ServiceView[];
  service: string | null;
  signal: string | null;
  onService: (name: string) => void;
  onSignal: (name: string) => void;
}) {
  const theme = useTheme();
  const c = theme.colors;
  return (
    <View testID="explorer-pane" style={{ width: theme.sizes.journeyPaneWidth, borderRightWidth: theme.borders.hairline, borderRightColor: c.line }}>
      <ScrollView contentContainerStyle={{ paddingHorizontal: theme.space.md, paddingTop: theme.space.xxl + theme.space.sm, paddingBottom: theme.space.xl, gap: theme.space.lg }}>
        <View style={{ paddingHorizontal: theme.space.md, flexDirection: 'row', justifyContent: 'space-between', alignItems: 'baseline' }}>
          <Text variant="label" tone="muted">
            Services
          </Text>
          <TextLink href="/signals" label="All" variant="smallStrong" testID="explorer-pane-all" />
        </View>
        <View style={{ gap: theme.space.xxs }}>
          {services.map((s) => {
            const open = s.name === service;
            return (
              <View key={s.id} style={{ gap: theme.space.xxs }}>
                <Pressable
                  testID={`explorer-pane-service-${s.name}`}
                  accessibilityRole="button"
                  accessibilityState={{ expanded: open }}
                  onPress={() => onService(s.name)}
                  style={({ hovered }: { pressed: boolean; hovered?: boolean }) => ({
                    flexDirection: 'row',
                    alignItems: 'center',
                    gap: theme.space.sm,
                    minHeight: theme.sizes.touchTarget,
                    paddingHorizontal: theme.space.md,
                    borderRadius: theme.radii.md,
                    backgroundColor: hovered ? c.sunken : 'transparent',
                  })}
                >
                  <Icon name={open ? 'chevron-down' : 'chevron-right'} size={theme.sizes.iconSm} color={c.inkMuted} />
                  <Text variant={open ? 'bodyStrong' : 'body'} numberOfLines={1} style={{ flex: 1 }}>
                    {s.name}
                  </Text>
                  <Text variant="numberSmall" tone="faint">
                    {s.signalCount}
                  </Text>
                </Pressable>
                {open ? <PaneSignals service={s.name} signal={signal} onSignal={onSignal} /> : null}
              </View>
            );
          })}
        </View>
      </ScrollView>
    </View>
  );
}

function PaneSignals({ service, signal, onSignal }: { service: string; signal: string | null; onSignal: (name: string) => void }) {
  const theme = useTheme();
  const c = theme.colors;
  const signals = useSignalsQuery(service);
  if (!signals.data) return <Loading label="Loading signals…" />;
  return (
    <View accessibilityRole="list" style={{ gap: theme.space.xxs, paddingLeft: theme.space.lg }}>
      {signals.data.map((s) => {
        const current = s.name === signal;
        return (
          <Pressable
            key={s.id}
            testID={`explorer-pane-signal-${s.name}`}
            accessibilityRole="button"
            accessibilityState={{ selected: current }}
            onPress={() => onSignal(s.name)}
            style={({ hovered }: { pressed: boolean; hovered?: boolean }) => ({
              paddingVertical: theme.space.sm,
              paddingHorizontal: theme.space.md,
              borderRadius: theme.radii.md,
              backgroundColor: current ? c.accentWash : hovered ? c.sunken : 'transparent',
              gap: theme.space.xxs,
            })}
          >
            <Text variant="code" tone={current ? 'accent' : 'ink'} numberOfLines={1}>
              {s.name}
            </Text>
            <Text variant="caption" tone="muted">
              {KIND_LABELS[s.kind]}
              {s.labelKeys.length ? ` · ${s.labelKeys.join(', ')}` : ''}
            </Text>
          </Pressable>
        );
      })}
    </View>
  );
}
