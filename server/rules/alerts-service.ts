// Alerts as people read them: what is open now (raised first), then history; and one alert with
// its recorded state spans and the rule's value for its group around it (the same evaluation).
import type { Knex } from 'knex';
import type { AlertDetail, AlertEventView, AlertSpanView, AlertsList, AlertsListQuery } from '../../shared/rules/api-schemas';
import { replayRule, replayStepMs, DEFAULT_CYCLE_MS } from '../../shared/rules/replay';
import { lookbackMs } from '../../shared/rules/rule-schema';
import type { OpenAlertState } from '../../shared/rules/state-machine';
import { AppError, NotFoundError } from '../errors';
import { alertsRepo } from './repositories/alerts-repo';
import { loadRuleHistory } from './rule-history';
import { ruleResolver } from './rule-resolver';

/** Points on an alert's chart. */
const DETAIL_STEPS = 600;
const DAY_MS = 86_400_000;

/** Consecutive states from the recorded events (what the evaluator actually did). */
export function spansFromEvents(events: AlertEventView[]): AlertSpanView[] {
  const spans: AlertSpanView[] = [];
  for (const e of events) {
    const open = spans[spans.length - 1];
    if (open && open.to === null && open.state !== e.state) open.to = e.at;
    if (e.state !== 'cleared' && (!open || open.to !== null)) spans.push({ state: e.state as OpenAlertState, from: e.at, to: null });
  }
  return spans;
}

export function alertsService(db: Knex, now: () => Date = () => new Date()) {
  return {
    async list(q: AlertsListQuery): Promise<AlertsList> {
      const filter = { ruleId: q.ruleId, service: q.service };
      const nowList = q.before === undefined ? await alertsRepo.listNow(db, filter) : [];
      const history = await alertsRepo.listHistory(db, { ...filter, all: q.all === 'true', before: q.before }, q.limit);
      const more = history.length > q.limit;
      const page = more ? history.slice(0, q.limit) : history;
      return { now: nowList, history: page, nextBefore: more ? page[page.length - 1]!.id : null };
    },

    async detail(id: number): Promise<AlertDetail> {
      const a = await alertsRepo.view(db, id);
      if (!a) throw new NotFoundError('Alert');
      const { document: rule, groupKey, serviceId: _s, ...alert } = a;
      const events = await alertsRepo.events(db, id);
      const warnings: string[] = [];
      let series: AlertDetail['series'] = null;
      try {
        const t = now().getTime();
        const opened = Date.parse(alert.openedAt);
        const ended = alert.clearedAt ? Date.parse(alert.clearedAt) : t;
        const pad = Math.max(15 * 60_000, 4 * rule.window * 1000);
        const to = Math.min(t, ended + pad);
        const from = Math.max(opened - pad, to - 7 * DAY_MS);
        const resolved = await ruleResolver(db).resolve(rule);
        const history = await loadRuleHistory(db, rule, resolved, from - lookbackMs(rule), to, { peersOf: alert.labels });
        const stepMs = replayStepMs(from, to, DEFAULT_CYCLE_MS, DETAIL_STEPS);
        const g = replayRule(rule, history.data, { from, to, stepMs }).groups.find((x) => x.key === groupKey);
        series = { from, to, stepMs, points: g ? g.points.map((p) => ({ t: p.t, v: p.v })) : [] };
        if (!g) warnings.push('No series of this group are left to chart');
      } catch (e) {
        // The rule may have changed since (another signal, a signal gone): the alert still shows.
        if (!(e instanceof AppError)) throw e;
        warnings.push(`The rule's values cannot be charted now: ${e.message}`);
      }
      return { alert, events, spans: spansFromEvents(events), series, warnings };
    },
  };
}
