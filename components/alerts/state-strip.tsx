// Pending / raised / no-data spans drawn as a strip under a chart. The signal chart draws lines
// only, so the bands live here, lined up with the chart's own time scale once it has laid out.
import { useEffect, useState, type MutableRefObject } from 'react';
import { View } from 'react-native';
import type { OpenAlertState } from '../../shared/rules/state-machine';
import type { TimeScale } from '../signals/chart/types';
import { useTheme } from '../theme';
import { StatusShape } from '../ui/status-mark';
import { Text } from '../ui/text';
import { ALERT_STATE_LOOK } from './alert-state-mark';

export interface StripSpan {
  state: OpenAlertState;
  from: number;
  /** null: still open at the end of the period. */
  to: number | null;
}

export interface StripRow {
  label: string;
  spans: StripSpan[];
}

/** Where the chart drew its first and last instant, read from its scale (it fills in after layout). */
function useChartEdges(scaleRef: MutableRefObject<TimeScale | null>, domain: [number, number], width: number) {
  const [edges, setEdges] = useState<[number, number]>([0, width]);
  useEffect(() => {
    const read = () => {
      const scale = scaleRef.current;
      if (!scale) return;
      const next: [number, number] = [scale.toX(domain[0]), scale.toX(domain[1])];
      setEdges((prev) => (Math.abs(prev[0] - next[0]) < 0.5 && Math.abs(prev[1] - next[1]) < 0.5 ? prev : next));
    };
    read();
    const timer = setInterval(read, 500);
    return () => clearInterval(timer);
  }, [scaleRef, domain, width]);
  return edges;
}

export function StateStrip({
  rows,
  domain,
  width,
  scaleRef,
  testID,
}: {
  rows: StripRow[];
  domain: [number, number];
  width: number;
  scaleRef: MutableRefObject<TimeScale | null>;
  testID: string;
}) {
  const theme = useTheme();
  const c = theme.colors;
  const [x0, x1] = useChartEdges(scaleRef, domain, width);
  const span = Math.max(1, domain[1] - domain[0]);
  // Positions inside the track, which itself sits under the chart's plotting area.
  const toX = (t: number) => ((Math.min(Math.max(t, domain[0]), domain[1]) - domain[0]) / span) * (x1 - x0);
  const look = {
    pending: { fill: c.cautionWash, edge: c.caution, style: 'dashed' as const },
    raised: { fill: c.badWash, edge: c.bad, style: 'solid' as const },
    no_data: { fill: c.sunken, edge: c.missing, style: 'dashed' as const },
  };
  return (
    <View testID={testID} style={{ gap: theme.space.xs }}>
      {rows.map((row, r) => (
        <View key={`${row.label}-${r}`} style={{ gap: theme.space.xxs }}>
          {rows.length > 1 ? (
            <Text variant="caption" tone="muted" numberOfLines={1}>
              {row.label}
            </Text>
          ) : null}
          <View
            accessibilityLabel={`States over time${rows.length > 1 ? ` for ${row.label}` : ''}`}
            style={{ marginLeft: x0, width: Math.max(0, x1 - x0), height: theme.sizes.statusRow, backgroundColor: c.surface, borderRadius: theme.radii.sm, borderWidth: theme.borders.hairline, borderColor: c.line }}
          >
            {row.spans.map((s, i) => {
              const left = toX(s.from);
              const right = toX(s.to ?? domain[1]);
              const w = Math.max(theme.borders.strong * 2, right - left);
              const l = look[s.state];
              return (
                <View
                  key={i}
                  testID={`${testID}-span-${s.state}`}
                  style={{
                    position: 'absolute',
                    top: 0,
                    bottom: 0,
                    left,
                    width: w,
                    backgroundColor: l.fill,
                    borderWidth: theme.borders.strong,
                    borderStyle: l.style,
                    borderColor: l.edge,
                    alignItems: 'center',
                    justifyContent: 'center',
                    overflow: 'hidden',
                  }}
                >
                  {w >= theme.sizes.mark + theme.space.sm ? <StatusShape tone={ALERT_STATE_LOOK[s.state].tone} size={theme.sizes.markSmall} /> : null}
                </View>
              );
            })}
          </View>
        </View>
      ))}
      <StripLegend />
    </View>
  );
}

function StripLegend() {
  const theme = useTheme();
  return (
    <View style={{ flexDirection: 'row', flexWrap: 'wrap', columnGap: theme.space.lg, rowGap: theme.space.xs }}>
      {(['pending', 'raised', 'no_data'] as const).map((state) => (
        <View key={state} style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.xs }}>
          <StatusShape tone={ALERT_STATE_LOOK[state].tone} size={theme.sizes.markSmall} />
          <Text variant="caption" tone="muted">
            {ALERT_STATE_LOOK[state].word}
          </Text>
        </View>
      ))}
    </View>
  );
}
