import { View } from 'react-native';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { SelectField } from '../../forms/select-field';
import { useTheme } from '../../theme';
import { Text } from '../../ui/text';

// Not a label value anyone sends; the empty string is one (a label present without a value).
const ANY = '__any__';

/**
 * Exact-match filters, one per label key. The values offered are those seen in this signal's
 * answers so far (the API has no list of label values); a chosen value stays offered.
 */
export function LabelFilters({
  title,
  labelKeys,
  seen,
  filters,
  onChange,
  testID,
}: {
  title: string;
  labelKeys: readonly string[];
  seen: Record<string, readonly string[]>;
  filters: Record<string, string>;
  onChange: (filters: Record<string, string>) => void;
  testID: string;
}) {
  const theme = useTheme();
  const { isPhone } = useBreakpoints();
  if (labelKeys.length === 0) {
    return (
      <Text variant="small" tone="muted">
        {`${title}: this signal has no labels.`}
      </Text>
    );
  }
  return (
    <View style={{ gap: theme.space.xs }}>
      <Text variant="label">{title}</Text>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.md }}>
        {labelKeys.map((key) => {
          const values = [...new Set([...(seen[key] ?? []), ...(filters[key] ? [filters[key]!] : [])])].sort();
          return (
            <View key={key} style={{ flexGrow: 1, flexBasis: theme.sizes.figureColumn * 2, maxWidth: isPhone ? undefined : theme.sizes.formMax * 0.6 }}>
              <SelectField
                label={key}
                accessibilityLabel={`Filter ${key}`}
                value={filters[key] ?? ANY}
                options={[{ value: ANY, label: 'any' }, ...values.map((v) => ({ value: v, label: v === '' ? '(empty)' : v }))]}
                onChange={(v) => {
                  const next = { ...filters };
                  if (v === ANY) delete next[key];
                  else next[key] = v;
                  onChange(next);
                }}
                compact
                testID={`${testID}-${key}`}
              />
            </View>
          );
        })}
      </View>
    </View>
  );
}
