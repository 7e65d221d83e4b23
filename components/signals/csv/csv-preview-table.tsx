import { ScrollView, View } from 'react-native';
import type { CsvPreview } from '../../../shared/schemas/signals';
import { useTheme } from '../../theme';
import { Text } from '../../ui/text';

/** IBM Plex Mono advances 0.6 em per character. */
const MONO_ADVANCE = 0.6;
const MAX_CHARS = 32;
const DELIMITERS: Record<string, string> = { ',': 'commas', ';': 'semicolons', '\t': 'tabs', '|': 'bars' };

/** The header and first rows as the server read them, scrolling sideways when wide. */
export function CsvPreviewTable({ preview }: { preview: CsvPreview }) {
  const theme = useTheme();
  const c = theme.colors;
  // Each column as wide as its longest cell (mono figures: every character the same width), so
  // rows line up; very long cells are cut.
  const charWidth = theme.type.numberSmall.fontSize * MONO_ADVANCE;
  const widths = preview.columns.map((col, i) => {
    const longest = Math.max(col.length, ...preview.rows.map((r) => (r[i] ?? '').length));
    return Math.min(longest, MAX_CHARS) * charWidth + theme.space.sm * 2;
  });
  const cell = (i: number) => ({ width: widths[i], paddingHorizontal: theme.space.sm, paddingVertical: theme.space.xs });
  return (
    <View style={{ gap: theme.space.sm }}>
      <Text variant="small" tone="muted">
        {`${preview.columns.length} columns separated by ${DELIMITERS[preview.delimiter] ?? `"${preview.delimiter}"`}; the first ${preview.rows.length} rows:`}
      </Text>
      <ScrollView horizontal testID="csv-preview-table" style={{ borderWidth: theme.borders.hairline, borderColor: c.line, borderRadius: theme.radii.md }}>
        <View>
          <View style={{ flexDirection: 'row', backgroundColor: c.sunken }}>
            {preview.columns.map((col, i) => (
              <View key={i} style={cell(i)}>
                <Text variant="label" numberOfLines={1}>
                  {col}
                </Text>
              </View>
            ))}
          </View>
          {preview.rows.map((row, r) => (
            <View key={r} style={{ flexDirection: 'row', borderTopWidth: theme.borders.hairline, borderTopColor: c.line }}>
              {preview.columns.map((_, i) => (
                <View key={i} style={cell(i)}>
                  <Text variant="numberSmall" numberOfLines={1}>
                    {row[i] ?? ''}
                  </Text>
                </View>
              ))}
            </View>
          ))}
        </View>
      </ScrollView>
    </View>
  );
}
