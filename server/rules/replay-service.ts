// POST /api/rules/replay: a draft evaluated over history with the evaluator's own evaluation and
// state machine (shared/rules), so it tunes against the past, not production.
import type { Knex } from 'knex';
import { DEFAULT_REPLAY_MS, MAX_REPLAY_MS, type ReplayRequest, type ReplayResponse } from '../../shared/rules/api-schemas';
import { evaluateRule } from '../../shared/rules/evaluate-rule';
import { DEFAULT_CYCLE_MS, MAX_REPLAY_STEPS, replayRule, replayStepMs } from '../../shared/rules/replay';
import { lookbackMs } from '../../shared/rules/rule-schema';
import { ValidationError } from '../errors';
import { loadRuleHistory } from './rule-history';
import { ruleResolver } from './rule-resolver';

/** Values one replay answer may hold (groups × steps). */
export const MAX_REPLAY_POINTS = 200_000;

export function replayService(db: Knex, now: () => Date) {
  const resolver = ruleResolver(db);
  return {
    async replay(req: ReplayRequest): Promise<ReplayResponse> {
      const to = req.to ?? now().getTime();
      const from = req.from ?? to - DEFAULT_REPLAY_MS;
      if (to - from > MAX_REPLAY_MS) throw new ValidationError(`from: replay at most ${MAX_REPLAY_MS / 86_400_000} days at once`, 'from');
      const rule = req.rule;
      const resolved = await resolver.resolve(rule, 'rule.');
      const history = await loadRuleHistory(db, rule, resolved, from - lookbackMs(rule), to, { field: 'rule.signal' });

      // Groups decide how many values come back: coarsen the default step to keep the answer bounded.
      const groups = Math.max(1, evaluateRule(rule, history.data, to).length);
      let stepMs: number;
      if (req.step !== undefined) {
        stepMs = req.step;
        const steps = Math.floor((to - from) / stepMs) + 1;
        if (steps > MAX_REPLAY_STEPS || steps * groups > MAX_REPLAY_POINTS)
          throw new ValidationError(`step: ${steps} steps × ${groups} groups exceed the limit (${MAX_REPLAY_STEPS} steps, ${MAX_REPLAY_POINTS} values); use a larger step`, 'step');
      } else {
        const maxSteps = Math.max(10, Math.min(MAX_REPLAY_STEPS, Math.floor(MAX_REPLAY_POINTS / groups)));
        stepMs = replayStepMs(from, to, DEFAULT_CYCLE_MS, maxSteps);
      }
      const result = replayRule(rule, history.data, { from, to, stepMs });
      const main = resolved.signals.find((s) => s.field === 'signal')!;
      const warnings: string[] = [];
      if (history.seriesCount === 0) warnings.push(`No series of ${main.name} match the rule's filters: it would only ever show no data`);
      return { ...result, service: rule.service, signal: main.name, unit: main.unit, samplingIntervalMs: resolved.samplingIntervalMs, warnings };
    },
  };
}
