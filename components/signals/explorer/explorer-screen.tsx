import { router } from 'expo-router';
import { View } from 'react-native';
import { isApiError } from '../../../hooks/api-client';
import { useServicesQuery } from '../../../hooks/queries/services';
import { useSessionUser } from '../../../hooks/queries/session';
import { useSignalQuery, useSignalsQuery } from '../../../hooks/queries/signals';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import type { ServiceView, SignalView } from '../../../shared/schemas/signals';
import { describeError } from '../../format/describe-error';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { EmptyState } from '../../ui/empty-state';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { Screen } from '../../ui/screen';
import { Text } from '../../ui/text';
import { TextLink } from '../../ui/text-link';
import { unitLabel } from '../format-value';
import { ChartPanel } from './chart-card';
import { effectiveFunction, explorerParamsPatch, FUNCTION_LABELS, readExplorerParams, toQueryParams, type ExplorerState, type SearchParams } from './explorer-params';
import { LatestValues } from './latest-values';
import { QueryControls, type ControlErrors } from './query-controls';
import { SignalPane } from './signal-pane';
import { SignalPickers } from './signal-pickers';
import { useSeenLabels } from './use-seen-labels';

/** Choosing a service or signal starts its query afresh: the old function, groups and filters may not apply. */
const FRESH: Partial<ExplorerState> = { fn: null, by: null, filters: {}, denominator: null, denominatorFilters: {}, bound: '', limit: '' };

export function SignalExplorerScreen({ params }: { params: SearchParams }) {
  const theme = useTheme();
  const { isWide } = useBreakpoints();
  const services = useServicesQuery();
  const state = readExplorerParams(params);
  // Until one is chosen, the service that reported most recently is shown.
  const service = state.service ?? newest(services.data)?.name ?? null;
  const update = (patch: Partial<ExplorerState>) => router.setParams(explorerParamsPatch(params, { ...state, service, ...patch }));
  const onService = (name: string) => update({ ...FRESH, service: name, signal: null });
  const onSignal = (name: string) => update({ ...FRESH, signal: name });
  const title = state.signal ?? 'Signal explorer';
  const body = services.isPending ? (
    <Loading label="Loading services…" />
  ) : services.isError ? (
    <Notice tone="bad" title="Could not load services">
      {describeError(services.error)}
    </Notice>
  ) : services.data.length === 0 ? (
    <Card>
      <EmptyState title="No services yet" body="Nothing has sent metrics. The Services page says how to send them.">
        <TextLink href="/signals" label="‹ Services" variant="smallStrong" testID="explorer-empty-services" />
      </EmptyState>
    </Card>
  ) : (
    <ExplorerBody state={state} service={service} services={services.data} showPickers={!isWide} onService={onService} onSignal={onSignal} update={update} />
  );

  const screen = (
    <Screen
      title={title}
      description={state.signal ? (service ?? undefined) : 'Choose a service and one of its signals, then how to look at it.'}
      before={isWide ? undefined : <TextLink href="/signals" label="‹ Services" variant="smallStrong" testID="explorer-back" />}
      testID="signal-explorer"
    >
      {body}
    </Screen>
  );
  if (!isWide || !services.data?.length) return screen;
  return (
    <View style={{ flex: 1, flexDirection: 'row', backgroundColor: theme.colors.paper }}>
      <SignalPane services={services.data} service={service} signal={state.signal} onService={onService} onSignal={onSignal} />
      <View style={{ flex: 1 }}>{screen}</View>
    </View>
  );
}

function newest(services: readonly ServiceView[] | undefined): ServiceView | undefined {
  return [...(services ?? [])].sort((a, b) => (b.lastSampleAt ? Date.parse(b.lastSampleAt) : 0) - (a.lastSampleAt ? Date.parse(a.lastSampleAt) : 0))[0];
}

function ExplorerBody({
  state,
  service,
  services,
  showPickers,
  onService,
  onSignal,
  update,
}: {
  state: ExplorerState;
  service: string | null;
  services: readonly ServiceView[];
  showPickers: boolean;
  onService: (name: string) => void;
  onSignal: (name: string) => void;
  update: (patch: Partial<ExplorerState>) => void;
}) {
  const theme = useTheme();
  const signals = useSignalsQuery(service);
  const signal = signals.data?.find((s) => s.name === state.signal);
  const pickers = showPickers ? (
    <SignalPickers services={services} service={service} signals={signals.data} signal={state.signal} onService={onService} onSignal={onSignal} />
  ) : null;
  let rest;
  if (signals.isError) rest = <Notice tone="bad">{describeError(signals.error)}</Notice>;
  else if (!signals.data) rest = <Loading label="Loading signals…" />;
  else if (!state.signal) rest = <EmptyState title="Choose a signal" body={`${service} has ${signals.data.length} signal${signals.data.length === 1 ? '' : 's'}. Pick one to chart it.`} testID="explorer-choose-signal" />;
  else if (!signal) rest = <Notice tone="caution" title={`${service} has no signal named ${state.signal}`}>Choose another; it may have been renamed or never arrived.</Notice>;
  else rest = <SignalQueryView state={state} signal={signal} signals={signals.data} update={update} />;
  return (
    <View style={{ gap: theme.space.xl }}>
      {pickers}
      {rest}
    </View>
  );
}

/** The query for one signal: its controls, the chart and the latest values. */
function SignalQueryView({ state, signal, signals, update }: { state: ExplorerState; signal: SignalView; signals: readonly SignalView[]; update: (patch: Partial<ExplorerState>) => void }) {
  const theme = useTheme();
  const { isWide } = useBreakpoints();
  const user = useSessionUser();
  const fn = effectiveFunction(state, signal.kind);
  const { params, errors: formErrors } = toQueryParams(state, signal);
  const query = useSignalQuery(params);
  const seen = useSeenLabels(signal.service, query.data);
  const serverField = isApiError(query.error) && query.error.field?.startsWith('query.') ? query.error.field.slice('query.'.length) : null;
  const fieldKeys = ['window', 'step', 'bound', 'limit', 'q', 'denominator'];
  const errors: ControlErrors = { ...formErrors };
  if (query.isError && serverField && fieldKeys.includes(serverField)) errors[serverField as keyof ControlErrors] = query.error.message;
  const unit = unitLabel(signal.unit);

  const about = (
    <Text variant="small" tone="muted" testID="explorer-signal-about">
      {`A ${signal.kind}${unit ? ` in ${unit}` : ''}, ${signal.seriesCount} series${signal.labelKeys.length ? `, labelled by ${signal.labelKeys.join(', ')}` : ''}.`}
    </Text>
  );
  const controlProps = {
    state,
    signal,
    fn,
    signals,
    seen: seen(signal.name),
    denominatorSeen: seen(state.denominator ?? signal.name),
    errors,
    onChange: update,
  };

  const chartTitle = `${FUNCTION_LABELS[fn]}${fn === 'quantile' ? ` p${Math.round(state.q * 100)}` : ''}${fn === 'raw' ? '' : `, ${state.window} window`}`;
  const chart = (
    <Card
      title={chartTitle}
      aside={query.isFetching ? <Text variant="caption" tone="faint">updating…</Text> : undefined}
      testID="explorer-chart"
    >
      {query.data ? (
        <View style={{ gap: theme.space.md }}>
          {query.isError && !(serverField && fieldKeys.includes(serverField)) ? <Notice tone="bad">{describeError(query.error, user?.role)}</Notice> : null}
          {query.isError ? (
            <Text variant="small" tone="muted">
              Showing the previous answer until the query is fixed.
            </Text>
          ) : null}
          {query.data.warnings.map((w) => (
            <Notice key={w} tone="caution">
              {w}
            </Notice>
          ))}
          <ChartPanel result={query.data} />
        </View>
      ) : query.isError ? (
        serverField && fieldKeys.includes(serverField) ? (
          <Notice tone="caution" testID="explorer-query-refused">{`Fix the ${serverField} above: ${query.error.message}`}</Notice>
        ) : (
          <Notice tone="bad" testID="explorer-query-error">
            {describeError(query.error, user?.role)}
          </Notice>
        )
      ) : params === null ? (
        <Text variant="small" tone="muted">
          Fix the marked field to see the chart.
        </Text>
      ) : (
        <Loading label="Querying…" />
      )}
    </Card>
  );

  const latest = query.data ? (
    <Card title="Latest values" description={query.data.samplingIntervalMs ? `Samples arrive about every ${Math.round(query.data.samplingIntervalMs / 1000)} s.` : undefined} testID="explorer-latest">
      <LatestValues result={query.data} />
    </Card>
  ) : null;

  if (isWide) {
    return (
      <View style={{ gap: theme.space.xl }}>
        <Card testID="explorer-query">
          {about}
          <QueryControls part="all" {...controlProps} />
        </Card>
        {chart}
        {latest}
      </View>
    );
  }
  return (
    <View style={{ gap: theme.space.lg }}>
      <Card testID="explorer-query">
        {about}
        <QueryControls part="main" {...controlProps} />
      </Card>
      {chart}
      {latest}
      <Card title="Grouping, filters and window" testID="explorer-more">
        <QueryControls part="detail" {...controlProps} />
      </Card>
    </View>
  );
}
