// A rule's data over a past range (replay, alert detail), read with the signals' own query
// repository: one rule, one range, rollups where raw days were dropped.
import type { Knex } from 'knex';
import type { RuleData, SampleSeries } from '../../shared/rules/evaluate-rule';
import { groupLabels, type Labels } from '../../shared/rules/label-groups';
import type { RuleDocument } from '../../shared/rules/rule-schema';
import { ValidationError } from '../errors';
import { QUERY_LIMITS } from '../signals/query-service';
import { partitionsRepo } from '../signals/repositories/partitions-repo';
import { queryRepo, type MatchedSeries } from '../signals/repositories/query-repo';
import type { ResolvedRule, ResolvedSignalRef } from './rule-resolver';

export interface RuleHistory {
  data: RuleData;
  seriesCount: number;
}

/**
 * Loads the series of the rule's signals with samples in [fromMs, toMs]. `peersOf` keeps only the
 * series of one alert's group (for an outlier: the whole peer group its member is scored against).
 */
export async function loadRuleHistory(
  db: Knex,
  rule: RuleDocument,
  resolved: ResolvedRule,
  fromMs: number,
  toMs: number,
  opts: { peersOf?: Labels; field?: string } = {},
): Promise<RuleHistory> {
  const keep = (s: MatchedSeries) => {
    if (!opts.peersOf) return true;
    const mine = groupLabels(s.labels, rule.groupBy);
    return rule.groupBy.every((k) => mine[k] === (opts.peersOf![k] ?? ''));
  };
  const match = async (ref: ResolvedSignalRef) => {
    const found = await queryRepo.matchSeries(db, ref.id, ref.filters, QUERY_LIMITS.maxSeries);
    if (found.length > QUERY_LIMITS.maxSeries)
      throw new ValidationError(`${ref.name} has more than ${QUERY_LIMITS.maxSeries} matching series (the limit per rule); add label filters`, opts.field ?? ref.field);
    return found.filter(keep);
  };
  const parts = await partitionsRepo.list(db, 'samples');
  const rawStart = parts.length ? parts[0]!.dayMs : Number.MAX_SAFE_INTEGER;
  const loadSamples = async (ref: ResolvedSignalRef): Promise<SampleSeries[]> => {
    const series = await match(ref);
    const data = await queryRepo.samples(db, series.map((s) => s.id), fromMs, toMs, rawStart);
    return series.map((s) => ({ id: s.id, labels: s.labels, samples: data.get(s.id) ?? [] }));
  };

  const main = resolved.signals.find((s) => s.field === 'signal')!;
  const requestsRef = resolved.signals.find((s) => s.field === 'requestsSignal');
  const data: RuleData = { signalKind: main.kind, series: [], histograms: [], requests: [] };
  if (main.kind === 'histogram') {
    const series = await match(main);
    const points = await queryRepo.histograms(db, series.map((s) => s.id), fromMs, toMs);
    data.histograms = series.map((s) => ({ id: s.id, labels: s.labels, points: points.get(s.id) ?? [] }));
  } else {
    data.series = await loadSamples(main);
  }
  if (requestsRef) data.requests = await loadSamples(requestsRef);
  return { data, seriesCount: data.series.length + data.histograms.length + data.requests.length };
}
