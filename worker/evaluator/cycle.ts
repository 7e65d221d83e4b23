// One evaluation cycle: every enabled rule evaluated at one instant. Reads are batched for all
// rules (evaluation-data-repo.ts): rules, signals, series and samples in a handful of statements;
// evaluation is pure (shared/rules); all writes land in one transaction (persist.ts).
import type { Knex } from 'knex';
import type PgBoss from 'pg-boss';
import type { HistogramPoint, Sample } from '../../shared/metrics';
import { evaluateRule, type GroupEvaluation, type RuleData } from '../../shared/rules/evaluate-rule';
import { lookbackMs, RULE_SIGNAL_KINDS, ruleSignals } from '../../shared/rules/rule-schema';
import { alertsRepo, type OpenAlert } from '../../server/rules/repositories/alerts-repo';
import { channelsRepo } from '../../server/rules/repositories/channels-repo';
import { evaluationDataRepo, type LiveRule, type MatchedSeries, type ResolvedSignal } from '../../server/rules/repositories/evaluation-data-repo';
import { maintenanceRepo } from '../../server/rules/repositories/maintenance-repo';
import { persistCycle, type PersistResult } from './persist';
import { planRule, type GroupChange } from './plan';

export interface CycleOptions {
  /** A series silent for longer than this is gone, not "no data" (default 1 h). */
  staleAfterMs: number;
  log: (msg: string) => void;
}

export interface CycleSummary extends PersistResult {
  at: number;
  rules: number;
  series: number;
  samples: number;
  groups: number;
  /** Rules that could not be evaluated (a signal gone or of another kind), with why. */
  errors: string[];
  ms: { load: number; evaluate: number; write: number; total: number };
}

export interface RuleInputs {
  main: { signal: ResolvedSignal; key: number } | null;
  requests: { signal: ResolvedSignal; key: number } | null;
  error: string | null;
}

export interface ReadPlan {
  rules: LiveRule[];
  inputs: Map<number, RuleInputs>;
  matched: Map<number, MatchedSeries[]>;
  /** Series id → the earliest instant any rule needs of it (ms). */
  sampleWants: Map<number, number>;
  histogramWants: Map<number, number>;
}

/**
 * What a cycle at `at` reads: the enabled rules, their signals and matching series, and how far
 * back each series is needed. (Also used by bench/evaluate.ts to read the same samples raw.)
 */
export async function planReads(db: Knex, at: number, staleAfterMs: number): Promise<ReadPlan> {
  const rules = await evaluationDataRepo.enabledRules(db);
  const signals = await evaluationDataRepo.resolveSignals(
    db,
    rules.flatMap((r) => ruleSignals(r.document).map((s) => ({ serviceId: r.serviceId, name: s.name }))),
  );

  // Identical (signal, filters) pairs across rules are matched and loaded once.
  const matcherKeys = new Map<string, number>();
  const matchers: Array<{ key: number; signalId: number; filters: Record<string, string> }> = [];
  const matcher = (signal: ResolvedSignal, filters: Record<string, string>) => {
    const k = `${signal.id}\u0001${JSON.stringify(Object.entries(filters).sort())}`;
    let key = matcherKeys.get(k);
    if (key === undefined) {
      key = matchers.length;
      matcherKeys.set(k, key);
      matchers.push({ key, signalId: signal.id, filters });
    }
    return key;
  };
  const inputs = new Map<number, RuleInputs>();
  for (const r of rules) {
    const inp: RuleInputs = { main: null, requests: null, error: null };
    for (const ref of ruleSignals(r.document)) {
      const signal = signals.get(`${r.serviceId}\u0001${ref.name}`);
      const allowed = ref.field === 'requestsSignal' ? ['counter'] : RULE_SIGNAL_KINDS[r.document.kind];
      if (!signal) inp.error = `rule ${r.id}: ${r.service} has no signal ${ref.name}`;
      else if (!allowed.includes(signal.kind)) inp.error = `rule ${r.id}: ${ref.name} is a ${signal.kind}`;
      else inp[ref.field === 'signal' ? 'main' : 'requests'] = { signal, key: matcher(signal, ref.filters) };
    }
    inputs.set(r.id, inp);
  }

  const matched = await evaluationDataRepo.matchSeries(db, matchers, at - staleAfterMs);
  // Each series is read from the earliest instant any rule needs of it.
  const sampleWants = new Map<number, number>();
  const histogramWants = new Map<number, number>();
  for (const r of rules) {
    const from = at - lookbackMs(r.document);
    const inp = inputs.get(r.id)!;
    for (const part of [inp.main, inp.requests]) {
      if (!part) continue;
      const wants = part.signal.kind === 'histogram' ? histogramWants : sampleWants;
      for (const s of matched.get(part.key) ?? []) wants.set(s.id, Math.min(wants.get(s.id) ?? Infinity, from));
    }
  }
  return { rules, inputs, matched, sampleWants, histogramWants };
}

export async function runEvaluationCycle(db: Knex, boss: PgBoss, at: number, opts: CycleOptions): Promise<CycleSummary> {
  const started = performance.now();
  const { rules, inputs, matched, sampleWants, histogramWants } = await planReads(db, at, opts.staleAfterMs);
  const [samples, histograms, open, maintenance, channels] = await Promise.all([
    evaluationDataRepo.samples(db, sampleWants, at),
    evaluationDataRepo.histograms(db, histogramWants, at),
    alertsRepo.open(db, rules.map((r) => r.id)),
    maintenanceRepo.activeServiceIds(db, new Date(at)),
    channelsRepo.enabledIds(db),
  ]);
  const loaded = performance.now();

  const openByRule = new Map<number, OpenAlert[]>();
  for (const a of open) {
    const list = openByRule.get(a.ruleId);
    if (list) list.push(a);
    else openByRule.set(a.ruleId, [a]);
  }
  const errors: string[] = [];
  const changes: GroupChange[] = [];
  let groups = 0;
  let sampleCount = 0;
  for (const list of samples.values()) sampleCount += list.length;
  for (const list of histograms.values()) sampleCount += list.length;
  const withSamples = (list: MatchedSeries[]) => list.map((s) => ({ id: s.id, labels: s.labels, samples: samples.get(s.id) ?? ([] as Sample[]) }));
  const withPoints = (list: MatchedSeries[]) => list.map((s) => ({ id: s.id, labels: s.labels, points: histograms.get(s.id) ?? ([] as HistogramPoint[]) }));

  for (const r of rules) {
    const inp = inputs.get(r.id)!;
    let evaluations: GroupEvaluation[] | null = null;
    let hasSeries = false;
    if (inp.error) {
      errors.push(inp.error);
    } else {
      const main = matched.get(inp.main!.key) ?? [];
      const requests = inp.requests ? (matched.get(inp.requests.key) ?? []) : [];
      hasSeries = main.length + requests.length > 0;
      const data: RuleData = {
        signalKind: inp.main!.signal.kind,
        series: inp.main!.signal.kind === 'histogram' ? [] : withSamples(main),
        histograms: inp.main!.signal.kind === 'histogram' ? withPoints(main) : [],
        requests: withSamples(requests),
      };
      try {
        evaluations = evaluateRule(r.document, data, at);
      } catch (e) {
        errors.push(`rule ${r.id}: ${(e as Error).message}`);
      }
    }
    const planned = planRule({ rule: r, at, evaluations, hasSeries, open: openByRule.get(r.id) ?? [], inMaintenance: maintenance.has(r.serviceId) });
    groups += evaluations?.length ?? 0;
    changes.push(...planned);
  }
  const evaluated = performance.now();

  const ruleMap = new Map<number, LiveRule>(rules.map((r) => [r.id, r]));
  const result = await persistCycle(db, boss, at, ruleMap, changes, channels);
  const done = performance.now();
  for (const e of errors) opts.log(`not evaluated: ${e}`);
  return {
    ...result,
    at,
    rules: rules.length,
    series: sampleWants.size + histogramWants.size,
    samples: sampleCount,
    groups,
    errors,
    ms: { load: loaded - started, evaluate: evaluated - loaded, write: done - evaluated, total: done - started },
  };
}
