// Checks a rule against what the database knows, after its zod schema passed: the service and
// signals exist, each signal is of a kind the rule can read, the window holds at least 2.5
// sampling intervals, the channels exist. Each refusal is a 400 naming the field.
import type { Knex } from 'knex';
import { checkWindow, estimateSamplingInterval, type Sample } from '../../shared/metrics';
import { RULE_KIND_LABELS, RULE_SIGNAL_KINDS, ruleSignals, type RuleDocument } from '../../shared/rules/rule-schema';
import type { SignalKind } from '../../shared/schemas/signals';
import { ValidationError } from '../errors';
import { queryRepo } from '../signals/repositories/query-repo';
import { servicesRepo } from '../signals/repositories/services-repo';
import { signalsRepo } from '../signals/repositories/signals-repo';
import { channelsRepo } from './repositories/channels-repo';
import { evaluationDataRepo } from './repositories/evaluation-data-repo';

export interface ResolvedSignalRef {
  field: 'signal' | 'requestsSignal';
  id: number;
  name: string;
  kind: SignalKind;
  unit: string;
  filters: Record<string, string>;
}

export interface ResolvedRule {
  serviceId: number;
  signals: ResolvedSignalRef[];
  /** The slowest matching series' sampling interval (null: too few samples to tell). */
  samplingIntervalMs: number | null;
}

/** Series and samples per series looked at to estimate the sampling interval. */
const INTERVAL_SERIES = 20;
const INTERVAL_SAMPLES = 40;

export function ruleResolver(db: Knex) {
  return {
    /** `prefix` names where the rule sits in the request body ('' or 'rule.'). */
    async resolve(rule: RuleDocument, prefix = ''): Promise<ResolvedRule> {
      const serviceId = await servicesRepo.idByName(db, rule.service);
      if (serviceId === null) throw new ValidationError(`${prefix}service: no service named ${rule.service}`, `${prefix}service`);

      const signals: ResolvedSignalRef[] = [];
      for (const ref of ruleSignals(rule)) {
        const field = `${prefix}${ref.field}`;
        const s = await signalsRepo.byName(db, serviceId, ref.name);
        if (!s) throw new ValidationError(`${field}: ${rule.service} has no signal named ${ref.name}`, field);
        const allowed = ref.field === 'requestsSignal' ? (['counter'] as const) : RULE_SIGNAL_KINDS[rule.kind];
        if (!allowed.includes(s.kind))
          throw new ValidationError(`${field}: a ${RULE_KIND_LABELS[rule.kind].toLowerCase()} rule reads a ${allowed.join(' or ')}; ${ref.name} is a ${s.kind}`, field);
        signals.push({ field: ref.field, id: s.id, name: s.name, kind: s.kind, unit: s.unit, filters: ref.filters });
      }

      const samplingIntervalMs = await this.samplingInterval(signals);
      if (samplingIntervalMs !== null) {
        const check = checkWindow(rule.window * 1000, samplingIntervalMs);
        // The message names the window and its minimum already.
        if (!check.ok) throw new ValidationError(check.message, `${prefix}window`);
      }

      if (rule.channelIds.length) {
        const known = await channelsRepo.existingIds(db, rule.channelIds);
        const missing = rule.channelIds.find((id) => !known.has(id));
        if (missing !== undefined) throw new ValidationError(`${prefix}channelIds: no webhook channel with id ${missing}`, `${prefix}channelIds`);
      }
      return { serviceId, signals, samplingIntervalMs };
    },

    /** The slowest sampling interval among a few matching series of each signal (shared/metrics estimate). */
    async samplingInterval(signals: ResolvedSignalRef[]): Promise<number | null> {
      let interval: number | null = null;
      for (const s of signals) {
        const series = (await queryRepo.matchSeries(db, s.id, s.filters, INTERVAL_SERIES)).slice(0, INTERVAL_SERIES);
        const times = await evaluationDataRepo.recentTimes(db, s.kind === 'histogram' ? 'histogram_points' : 'samples', series.map((x) => x.id), INTERVAL_SAMPLES);
        for (const ts of times.values()) {
          const i = estimateSamplingInterval(ts.map((t): Sample => ({ t, v: 0 })));
          if (i !== null && (interval === null || i > interval)) interval = i;
        }
      }
      return interval;
    },
  };
}
