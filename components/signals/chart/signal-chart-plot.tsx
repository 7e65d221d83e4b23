// The chart itself: Skia + victory-native. On the web it is only loaded through
// components/charts (one chunk with every chart and CanvasKit), so nothing here may be imported
// from a screen directly; reanimated and gesture-handler come in through victory-native and stay
// in that chunk too.
import { Circle, DashPathEffect, Group, Line as SkiaLine, Path, Skia, useFont, vec } from '@shopify/react-native-skia';
import { useMemo } from 'react';
import { View } from 'react-native';
import { CartesianChart, Line, Scatter } from 'victory-native';
import { useTheme } from '../../theme';
import { noTrafficRuns } from './no-traffic-runs';
import type { SignalChartProps } from './types';

/** Few enough points that each one is worth a dot (a lone point between gaps is otherwise invisible). */
const DOTS_UP_TO = 60;

/** Missing data is hollow and dashed: one capsule along the axis per stretch without traffic. */
function hollowBars(spans: Array<[number, number]>, y: number, r: number) {
  const p = Skia.Path.Make();
  for (const [x0, x1] of spans) p.addRRect(Skia.RRectXY(Skia.XYWHRect(x0 - r, y - r, x1 - x0 + 2 * r, 2 * r), r, r));
  return p;
}

export default function SignalChartPlot({ model, width, height, selectedRow, formatX, formatY, scaleRef }: SignalChartProps) {
  const theme = useTheme();
  const c = theme.colors;
  const ch = theme.chart;
  const font = useFont(require('@expo-google-fonts/ibm-plex-mono/400Regular/IBMPlexMono_400Regular.ttf'), ch.axisFont);
  const keys = model.lines.map((l) => l.key);
  const selected = selectedRow !== null ? model.rows[selectedRow] : undefined;
  const quiet = useMemo(() => noTrafficRuns(model), [model]);
  return (
    <View testID="signal-chart-canvas" style={{ width, height }} accessibilityRole="image" accessibilityLabel="Signal values over time">
      <CartesianChart
        data={model.rows}
        xKey="t"
        yKeys={keys}
        padding={ch.padding}
        domain={{ x: model.domain, y: model.yDomain }}
        xAxis={{
          font,
          tickCount: Math.max(2, Math.min(6, Math.floor(width / 120))),
          labelColor: c.inkMuted,
          lineColor: c.line,
          formatXLabel: (v) => formatX(Number(v)),
        }}
        yAxis={[{ font, tickCount: 4, labelColor: c.inkMuted, lineColor: c.line, formatYLabel: (v) => formatY(Number(v)) }]}
        frame={{ lineColor: c.line, lineWidth: theme.borders.hairline }}
      >
        {({ points, xScale, yScale, chartBounds }) => {
          // The pointer overlay maps pixels to times with the scale this layout really used.
          scaleRef.current = { toX: (t) => xScale(t), toT: (x) => xScale.invert(x) };
          const selX = selected ? xScale(selected.t) : null;
          return (
            <Group>
              {model.lines.map((line) => {
                const dash = ch.dashes[line.style % ch.dashes.length];
                const colour = c.series[line.style % c.series.length]!;
                const pts = points[line.key] ?? [];
                return (
                  <Group key={line.key}>
                    <Line points={pts} color={colour} strokeWidth={ch.lineWidth} connectMissingData={model.connectGaps}>
                      {dash ? <DashPathEffect intervals={[...dash]} /> : null}
                    </Line>
                    {model.rows.length <= DOTS_UP_TO ? <Scatter points={pts} radius={ch.dotRadius} color={colour} /> : null}
                  </Group>
                );
              })}
              {quiet.length ? (
                <Path
                  path={hollowBars(
                    quiet.map(([a, b]): [number, number] => [xScale(a), xScale(b)]),
                    chartBounds.bottom - ch.voidRadius - theme.borders.strong,
                    ch.voidRadius,
                  )}
                  color={c.missing}
                  style="stroke"
                  strokeWidth={theme.borders.strong}
                >
                  <DashPathEffect intervals={[3, 2]} />
                </Path>
              ) : null}
              {selected && selX !== null ? (
                <Group>
                  <SkiaLine p1={vec(selX, chartBounds.top)} p2={vec(selX, chartBounds.bottom)} color={c.inkFaint} strokeWidth={theme.borders.hairline} />
                  {model.lines.map((line) => {
                    const v = selected[line.key];
                    if (v === null || v === undefined) return null;
                    return <Circle key={line.key} cx={selX} cy={yScale(v)} r={ch.dotRadius + 1.5} color={c.series[line.style % c.series.length]!} />;
                  })}
                </Group>
              ) : null}
            </Group>
          );
        }}
      </CartesianChart>
    </View>
  );
}
