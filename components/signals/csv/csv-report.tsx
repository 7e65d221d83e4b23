import { View } from 'react-native';
import type { CsvImportResult } from '../../../shared/schemas/signals';
import { useTheme } from '../../theme';
import { Notice } from '../../ui/notice';
import { StatusMark } from '../../ui/status-mark';
import { Text } from '../../ui/text';

const SHOWN = 100;

/** Counts in mono, then every refused row with the column and the reason (first hundred on screen). */
export function CsvReport({ result }: { result: CsvImportResult }) {
  const theme = useTheme();
  const c = theme.colors;
  const tone = result.rejected === 0 ? 'good' : result.imported + result.duplicates === 0 ? 'bad' : 'caution';
  const summary =
    result.rejected === 0
      ? result.imported === 0 && result.duplicates > 0
        ? 'Every row was already stored: nothing changed.'
        : 'Every row was stored.'
      : `${result.rejected} row${result.rejected === 1 ? ' was' : 's were'} refused; the good rows were kept. Fix the refused rows and upload the file again: rows already stored count as duplicates.`;
  return (
    <View testID="csv-report" style={{ gap: theme.space.lg }}>
      <StatusMark tone={tone} label={tone === 'good' ? 'Imported' : tone === 'bad' ? 'Nothing imported' : 'Imported with refusals'} chip />
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', columnGap: theme.space.xl, rowGap: theme.space.sm }}>
        <Count label="Rows read" value={result.rows} testID="csv-report-rows" />
        <Count label="Stored now" value={result.imported} testID="csv-report-imported" />
        <Count label="Already stored" value={result.duplicates} testID="csv-report-duplicates" />
        <Count label="Refused" value={result.rejected} testID="csv-report-rejected" />
      </View>
      <Text variant="small">{summary}</Text>
      {result.errors.length > 0 ? (
        <View testID="csv-report-errors" style={{ borderTopWidth: theme.borders.hairline, borderTopColor: c.line }}>
          {result.errors.slice(0, SHOWN).map((e, i) => (
            <View
              key={`${e.row}-${i}`}
              testID={`csv-error-row-${e.row}`}
              style={{ flexDirection: 'row', gap: theme.space.md, paddingVertical: theme.space.sm, borderBottomWidth: theme.borders.hairline, borderBottomColor: c.line }}
            >
              <Text variant="numberSmall" style={{ width: theme.sizes.figureColumn * 0.75 }}>
                {`row ${e.row}`}
              </Text>
              <View style={{ flex: 1, gap: theme.space.xxs }}>
                {e.field ? (
                  <Text variant="smallStrong" numberOfLines={1}>
                    {e.field}
                  </Text>
                ) : null}
                <Text variant="small" tone="muted">
                  {e.message}
                </Text>
              </View>
            </View>
          ))}
        </View>
      ) : null}
      {result.errors.length > SHOWN || result.errorsTruncated ? (
        <Notice tone="info">
          {`Showing the first ${Math.min(SHOWN, result.errors.length)} of ${result.rejected} refused rows${result.errorsTruncated ? ' (the server reports at most the first 1 000)' : ''}.`}
        </Notice>
      ) : null}
    </View>
  );
}

function Count({ label, value, testID }: { label: string; value: number; testID: string }) {
  const theme = useTheme();
  return (
    <View style={{ gap: theme.space.xxs }}>
      <Text variant="caption" tone="muted">
        {label}
      </Text>
      <Text variant="numberLarge" testID={testID}>
        {value}
      </Text>
    </View>
  );
}
