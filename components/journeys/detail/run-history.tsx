import { Link } from 'expo-router';
import { Pressable, View, type ViewStyle } from 'react-native';
import { useJourneyRunsQuery } from '../../../hooks/queries/runs';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import type { Verdict } from '../../../shared/journey/run-result';
import type { RunSummary } from '../../../shared/schemas/journeys';
import { describeError } from '../../format/describe-error';
import { formatMs } from '../../format/duration';
import { formatRelative, formatSlot } from '../../format/time';
import { SelectField } from '../../forms/select-field';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { EmptyState } from '../../ui/empty-state';
import { Icon } from '../../ui/icon';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { Text } from '../../ui/text';
import { VerdictMark } from '../verdict-mark';
import { RUN_COLUMNS as COLUMNS } from './run-columns';

type VerdictFilter = Verdict | 'all';
const VERDICT_OPTIONS = [
  { value: 'all', label: 'All verdicts' },
  { value: 'pass', label: 'Pass' },
  { value: 'fail', label: 'Fail' },
  { value: 'void', label: 'Void (missing data)' },
] as const satisfies readonly { value: VerdictFilter; label: string }[];


/** What happened in a run, in a few words (failure class and step, or why it is void). */
export function runOutcome(run: RunSummary): string {
  if (run.verdict === 'void') return run.voidReason ?? 'the runner could not run this slot';
  if (run.verdict === 'fail') {
    const where = run.failedStep !== null ? ` at step ${run.failedStep + 1}` : '';
    return `${run.failureClass ?? 'failed'}${where}`;
  }
  return run.trigger === 'missed' ? 'recorded after an outage' : 'all steps passed';
}

export interface RunFilters {
  verdict: VerdictFilter;
  vantage: string;
}

/** Run history, newest first, with verdict and vantage filters and "load more" paging. */
export function RunHistory({
  journeyId,
  vantages,
  filters,
  onFilters,
}: {
  journeyId: number;
  vantages: string[];
  filters: RunFilters;
  onFilters: (next: RunFilters) => void;
}) {
  const theme = useTheme();
  const { atLeastTablet } = useBreakpoints();
  const runs = useJourneyRunsQuery(journeyId, {
    verdict: filters.verdict === 'all' ? undefined : filters.verdict,
    vantage: filters.vantage === 'all' ? undefined : filters.vantage,
  });
  const items = runs.data?.pages.flatMap((page) => page.items) ?? [];
  const vantageOptions = [{ value: 'all', label: 'All vantages' }, ...vantages.map((v) => ({ value: v, label: v }))];
  const filtered = filters.verdict !== 'all' || filters.vantage !== 'all';

  return (
    <Card title="Run history" description="Newest first. Open a run for its steps, timings and checks." testID="run-history">
      <View style={{ flexDirection: atLeastTablet ? 'row' : 'column', gap: theme.space.md }}>
        <View style={atLeastTablet ? { flex: 1 } : undefined}>
          <SelectField
            label="Verdict"
            accessibilityLabel="Show runs with this verdict"
            value={filters.verdict}
            options={VERDICT_OPTIONS}
            onChange={(verdict) => onFilters({ ...filters, verdict })}
            testID="runs-filter-verdict"
            compact
          />
        </View>
        <View style={atLeastTablet ? { flex: 1 } : undefined}>
          <SelectField
            label="Vantage"
            accessibilityLabel="Show runs from this vantage"
            value={filters.vantage}
            options={vantageOptions}
            onChange={(vantage) => onFilters({ ...filters, vantage })}
            hint={atLeastTablet ? undefined : 'Also narrows the chart.'}
            testID="runs-filter-vantage"
            compact
          />
        </View>
      </View>
      {runs.isPending ? (
        <Loading label="Loading runs…" />
      ) : runs.isError ? (
        <Notice tone="bad" title="Could not load runs">
          {describeError(runs.error)}
        </Notice>
      ) : items.length === 0 ? (
        <EmptyState
          testID="runs-empty"
          title={filtered ? 'No runs match these filters' : 'No runs yet'}
          body={filtered ? 'Choose another verdict or vantage.' : 'The scheduler queues the journey at its next slot; the first run shows up here once a vantage has run it.'}
        />
      ) : (
        <View accessibilityRole="list" testID="runs-list">
          {atLeastTablet ? <HeaderRow /> : null}
          {items.map((run, index) => (
            <View key={run.id} style={index > 0 || atLeastTablet ? { borderTopWidth: theme.borders.hairline, borderTopColor: theme.colors.line } : undefined}>
              <RunRow run={run} journeyId={journeyId} table={atLeastTablet} />
            </View>
          ))}
        </View>
      )}
      {runs.hasNextPage ? (
        <Button label="Load more" icon="chevrons-down" onPress={() => void runs.fetchNextPage()} busy={runs.isFetchingNextPage} testID="runs-load-more" />
      ) : null}
    </Card>
  );
}

function HeaderRow() {
  const theme = useTheme();
  const cell = (label: string, style: ViewStyle) => (
    <View style={style}>
      <Text variant="label" tone="muted">
        {label}
      </Text>
    </View>
  );
  return (
    <View style={{ flexDirection: 'row', gap: theme.space.md, paddingBottom: theme.space.sm }}>
      {cell('Verdict', COLUMNS.verdict)}
      {cell('Slot', COLUMNS.slot)}
      {cell('Vantage', COLUMNS.vantage)}
      {cell('Duration', COLUMNS.duration)}
      {cell('What happened', COLUMNS.what)}
      <View style={COLUMNS.open} />
    </View>
  );
}

function RunRow({ run, journeyId, table }: { run: RunSummary; journeyId: number; table: boolean }) {
  const theme = useTheme();
  const href = `/journeys/${journeyId}/runs/${run.id}` as const;
  if (table) {
    return (
      <Link href={href} asChild>
        <Pressable
          testID={`run-row-${run.id}`}
          accessibilityRole="link"
          accessibilityLabel={`Run ${run.id}, ${run.verdict}: open`}
          style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.md, minHeight: theme.sizes.touchTarget, paddingVertical: theme.space.sm }}
        >
          <View style={COLUMNS.verdict}>
            <VerdictMark verdict={run.verdict} />
          </View>
          <View style={COLUMNS.slot}>
            <Text variant="numberSmall">{formatSlot(run.slotAt)}</Text>
          </View>
          <View style={COLUMNS.vantage}>
            <Text variant="small" numberOfLines={1}>
              {run.vantage}
            </Text>
          </View>
          <View style={COLUMNS.duration}>
            <Text variant="numberSmall">{formatMs(run.durationMs)}</Text>
          </View>
          <View style={COLUMNS.what}>
            <Text variant="small" tone="muted" numberOfLines={2}>
              {runOutcome(run)}
            </Text>
          </View>
          <View style={COLUMNS.open}>
            <Icon name="chevron-right" size={theme.sizes.iconSm} color={theme.colors.inkFaint} />
          </View>
        </Pressable>
      </Link>
    );
  }
  return (
    <Link href={href} asChild>
      <Pressable
        testID={`run-row-${run.id}`}
        accessibilityRole="link"
        accessibilityLabel={`Run ${run.id}, ${run.verdict}: open`}
        style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.md, minHeight: theme.sizes.touchTarget, paddingVertical: theme.space.md }}
      >
        <View style={{ flex: 1, gap: theme.space.xs }}>
          <View style={{ flexDirection: 'row', justifyContent: 'space-between', alignItems: 'center', gap: theme.space.md }}>
            <VerdictMark verdict={run.verdict} />
            <Text variant="numberSmall">{formatMs(run.durationMs)}</Text>
          </View>
          <Text variant="small" tone="muted">
            <Text variant="numberSmall" tone="muted">
              {formatRelative(run.slotAt)}
            </Text>
            {` · ${run.vantage} · ${runOutcome(run)}`}
          </Text>
        </View>
        <Icon name="chevron-right" size={theme.sizes.icon} color={theme.colors.inkFaint} />
      </Pressable>
    </Link>
  );
}
