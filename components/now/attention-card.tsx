import { View } from 'react-native';
import { useTheme } from '../theme';
import { Card } from '../ui/card';
import { EmptyState } from '../ui/empty-state';
import { Notice } from '../ui/notice';

/**
 * What needs a person, most urgent first. Today that can only be Parallax itself; open episodes,
 * raised alerts and release watches join it as those parts arrive.
 */
export function AttentionCard({ systemProblems }: { systemProblems: string[] }) {
  const theme = useTheme();
  return (
    <Card title="Needs a person" testID="now-attention">
      <View style={{ gap: theme.space.lg }}>
        {systemProblems.length > 0 ? (
          <Notice tone="bad" title="Parallax itself needs a look" testID="now-system-problem">
            {systemProblems.join(' ')}
          </Notice>
        ) : null}
        <EmptyState
          title="Nothing is being watched yet"
          body="Once journeys run and services send their metrics, this lists open episodes, raised alerts, release watches in progress and this week's coverage, most urgent first."
        />
      </View>
    </Card>
  );
}
