// The chart itself: Skia + victory-native. On the web this file is loaded on demand (its own
// chunk, with CanvasKit), so nothing here may be imported from a screen directly; reanimated and
// gesture-handler come in through victory-native and stay in this chunk too.
import { DashPathEffect, Group, Path, Skia, useFont } from '@shopify/react-native-skia';
import { View } from 'react-native';
import { CartesianChart, Line, Scatter } from 'victory-native';
import { formatMs } from '../../format/duration';
import { useTheme } from '../../theme';
import type { ChartMarker } from './chart-data';
import type { TimingChartProps } from './types';

const clock = new Intl.DateTimeFormat(undefined, { hour: '2-digit', minute: '2-digit' });

function diamond(x: number, y: number, r: number) {
  const p = Skia.Path.Make();
  p.moveTo(x, y - r);
  p.lineTo(x + r, y);
  p.lineTo(x, y + r);
  p.lineTo(x - r, y);
  p.close();
  return p;
}

function circles(points: { x: number; y: number }[], r: number) {
  const p = Skia.Path.Make();
  for (const pt of points) p.addCircle(pt.x, pt.y, r);
  return p;
}

export default function TimingChartPlot({ data, width, height }: TimingChartProps) {
  const theme = useTheme();
  const c = theme.colors;
  const ch = theme.chart;
  const font = useFont(require('@expo-google-fonts/ibm-plex-mono/400Regular/IBMPlexMono_400Regular.ttf'), ch.axisFont);
  const keys = data.series.map((s) => s.key);
  const fails = data.markers.filter((m): m is ChartMarker & { y: number } => m.verdict === 'fail' && m.y !== null);
  const voids = data.markers.filter((m) => m.verdict === 'void' || m.y === null);
  // A fixed time domain when there is only one run, so it is drawn in the middle, not on an edge.
  const single = data.rows.length === 1 ? data.rows[0]!.t : null;
  const domainX: [number, number] | undefined = single !== null ? [single - 30 * 60_000, single + 30 * 60_000] : undefined;
  const maxY = Math.max(1, ...data.rows.flatMap((r) => keys.map((k) => r[k] ?? 0)));

  if (keys.length === 0) {
    // Only void runs: nothing to draw lines from, but the runs still show as missing data.
    keys.push('none');
  }

  return (
    <View testID="timing-chart" style={{ width, height }} accessibilityRole="image" accessibilityLabel="Step timings over time">
      <CartesianChart
        data={data.rows as Record<string, number>[]}
        xKey="t"
        yKeys={keys}
        padding={ch.padding}
        domain={{ x: domainX, y: [0, maxY * 1.1] }}
        domainPadding={ch.domainPadding}
        xAxis={{
          font,
          tickCount: Math.max(2, Math.min(6, Math.floor(width / 110))),
          labelColor: c.inkMuted,
          lineColor: c.line,
          formatXLabel: (v) => clock.format(Number(v)),
        }}
        yAxis={[{ font, tickCount: 4, labelColor: c.inkMuted, lineColor: c.line, formatYLabel: (v) => formatMs(Number(v)) }]}
        frame={{ lineColor: c.line, lineWidth: theme.borders.hairline }}
      >
        {({ points, xScale, yScale, chartBounds }) => (
          <Group>
            {data.series.map((s, i) => {
              const dash = ch.dashes[i % ch.dashes.length];
              const colour = c.series[i % c.series.length]!;
              const pts = points[s.key] ?? [];
              return (
                <Group key={s.key}>
                  <Line points={pts} color={colour} strokeWidth={ch.lineWidth}>
                    {dash ? <DashPathEffect intervals={[...dash]} /> : null}
                  </Line>
                  <Scatter points={pts} radius={ch.dotRadius} color={colour} />
                </Group>
              );
            })}
            {fails.map((m) => (
              <Path key={`f${m.runId}`} path={diamond(xScale(m.t), yScale(m.y), ch.failRadius)} color={c.bad} />
            ))}
            {voids.length ? (
              <Path
                path={circles(
                  voids.map((m) => ({ x: xScale(m.t), y: chartBounds.bottom - ch.voidRadius - theme.borders.strong })),
                  ch.voidRadius,
                )}
                color={c.missing}
                style="stroke"
                strokeWidth={theme.borders.strong}
              >
                <DashPathEffect intervals={[...ch.voidDash]} />
              </Path>
            ) : null}
          </Group>
        )}
      </CartesianChart>
    </View>
  );
}
