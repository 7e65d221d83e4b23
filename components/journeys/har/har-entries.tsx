import { View } from 'react-native';
import type { HarImportEntry } from '../../../shared/journey/har-import';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { formatMs } from '../../format/duration';
import { useTheme } from '../../theme';
import { StatusMark } from '../../ui/status-mark';
import { Text } from '../../ui/text';
import { HAR_COLUMNS as COLUMNS } from './har-columns';


function splitUrl(url: string): { path: string; host: string } {
  try {
    const u = new URL(url);
    return { path: u.pathname, host: u.host };
  } catch {
    return { path: url, host: '' };
  }
}

function KeptMark({ entry }: { entry: HarImportEntry }) {
  return entry.kept ? <StatusMark tone="good" label="Kept" /> : <StatusMark tone="off" label="Left out" />;
}

/** Every recorded request, with whether it became a step and why. */
export function HarEntries({ entries }: { entries: HarImportEntry[] }) {
  const theme = useTheme();
  const c = theme.colors;
  const { atLeastTablet } = useBreakpoints();
  return (
    <View accessibilityRole="list" testID="har-entries" style={{ gap: atLeastTablet ? 0 : theme.space.xs }}>
      {atLeastTablet ? (
        <View style={{ flexDirection: 'row', gap: theme.space.md, paddingBottom: theme.space.sm }}>
          {(
            [
              ['In the draft', COLUMNS.kept],
              ['Method', COLUMNS.method],
              ['URL', COLUMNS.url],
              ['Status', COLUMNS.status],
              ['What it is', COLUMNS.kind],
              ['Time', COLUMNS.time],
            ] as const
          ).map(([label, style]) => (
            <View key={label} style={style}>
              <Text variant="label" tone="muted">
                {label}
              </Text>
            </View>
          ))}
        </View>
      ) : null}
      {entries.map((e) => (
        <View
          key={e.index}
          testID={`har-entry-${e.index}`}
          style={{
            flexDirection: atLeastTablet ? 'row' : 'column',
            alignItems: atLeastTablet ? 'center' : 'stretch',
            gap: atLeastTablet ? theme.space.md : theme.space.xxs,
            paddingVertical: theme.space.sm,
            borderTopWidth: theme.borders.hairline,
            borderTopColor: c.line,
            opacity: e.kept ? 1 : 0.8,
          }}
        >
          {atLeastTablet ? (
            <>
              <View style={COLUMNS.kept}>
                <KeptMark entry={e} />
              </View>
              <Text variant="numberSmall" style={COLUMNS.method}>
                {e.method}
              </Text>
              <View style={COLUMNS.url}>
                <Text variant="numberSmall" numberOfLines={1} ellipsizeMode="middle">
                  {splitUrl(e.url).path}
                </Text>
                <Text variant="caption" tone="faint" numberOfLines={1}>
                  {splitUrl(e.url).host}
                </Text>
              </View>
              <Text variant="numberSmall" align="right" style={COLUMNS.status}>
                {e.status || '—'}
              </Text>
              <Text variant="small" tone="muted" numberOfLines={1} style={COLUMNS.kind}>
                {`${e.kind}: ${e.reason}`}
              </Text>
              <Text variant="numberSmall" tone="muted" align="right" style={COLUMNS.time}>
                {e.timeMs >= 0 ? formatMs(e.timeMs) : '—'}
              </Text>
            </>
          ) : (
            <>
              <View style={{ flexDirection: 'row', justifyContent: 'space-between', gap: theme.space.md }}>
                <KeptMark entry={e} />
                <Text variant="numberSmall" tone="muted">{`${e.status || '—'} · ${e.timeMs >= 0 ? formatMs(e.timeMs) : '—'}`}</Text>
              </View>
              <Text variant="numberSmall" style={{ wordBreak: 'break-all' } as object}>{`${e.method} ${e.url}`}</Text>
              <Text variant="caption" tone="muted">{`${e.kind}: ${e.reason}`}</Text>
            </>
          )}
        </View>
      ))}
    </View>
  );
}
