// Alert rules as use-cases: create, change, enable/disable, duplicate, delete. Every change is
// audited in its own transaction. A change to *when* a rule holds (anything but its name, note,
// severity, links and recipients) ends the rule's open alerts: they were judged by the old condition.
import type { Knex } from 'knex';
import type { RuleView } from '../../shared/rules/api-schemas';
import { describeCondition, PRESENTATION_FIELDS, type RuleDocument } from '../../shared/rules/rule-schema';
import type { Principal } from '../auth/principal';
import { NotFoundError } from '../errors';
import { auditRepo } from '../repositories/audit';
import { alertsRepo } from './repositories/alerts-repo';
import { rulesRepo, type RuleRecord } from './repositories/rules-repo';
import { ruleResolver } from './rule-resolver';

export function toRuleView(r: RuleRecord): RuleView {
  return {
    id: r.id,
    document: r.document,
    name: r.name,
    kind: r.kind,
    service: r.service,
    enabled: r.enabled,
    severity: r.document.severity,
    condition: describeCondition(r.document),
    version: r.version,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
    open: r.open,
  };
}

/** The parts of a document that decide when it holds. */
function conditionOf(doc: RuleDocument): string {
  const copy: Record<string, unknown> = { ...doc };
  for (const f of PRESENTATION_FIELDS) delete copy[f];
  return JSON.stringify(Object.keys(copy).sort().map((k) => [k, copy[k]]));
}

const userId = (p: Principal) => (p.type === 'user' ? p.id : null);

export function rulesService(db: Knex, now: () => Date = () => new Date()) {
  const resolver = ruleResolver(db);

  async function view(id: number): Promise<RuleView> {
    const r = await rulesRepo.byId(db, id);
    if (!r) throw new NotFoundError('Rule');
    return toRuleView(r);
  }

  async function locked(tx: Knex, id: number) {
    const l = await rulesRepo.lock(tx, id);
    const r = l && (await rulesRepo.byId(tx, id));
    if (!r) throw new NotFoundError('Rule');
    return r;
  }

  return {
    async list(filter: { service?: string; enabled?: boolean }): Promise<RuleView[]> {
      return (await rulesRepo.list(db, filter)).map(toRuleView);
    },

    get: view,

    async create(actor: Principal, doc: RuleDocument): Promise<RuleView> {
      const id = await db.transaction(async (tx) => {
        const resolved = await ruleResolver(tx).resolve(doc);
        const newId = await rulesRepo.insert(tx, { name: doc.name, kind: doc.kind, serviceId: resolved.serviceId, document: doc, enabled: doc.enabled }, userId(actor));
        await auditRepo.record(tx, actor, { action: 'rule.create', subjectType: 'alert_rule', subjectId: newId, detail: { name: doc.name, kind: doc.kind, service: doc.service } });
        return newId;
      });
      return view(id);
    },

    async update(actor: Principal, id: number, doc: RuleDocument): Promise<RuleView> {
      await db.transaction(async (tx) => {
        const before = await locked(tx, id);
        const resolved = await ruleResolver(tx).resolve(doc);
        const conditionChanged = conditionOf(before.document) !== conditionOf(doc);
        await rulesRepo.update(tx, id, { name: doc.name, kind: doc.kind, serviceId: resolved.serviceId, document: doc, enabled: doc.enabled }, userId(actor), conditionChanged || before.enabled !== doc.enabled);
        const ended = conditionChanged || (before.enabled && !doc.enabled) ? await alertsRepo.closeForRule(tx, id, now(), conditionChanged ? 'rule_changed' : 'rule_disabled') : 0;
        await auditRepo.record(tx, actor, { action: 'rule.update', subjectType: 'alert_rule', subjectId: id, detail: { name: doc.name, conditionChanged, endedAlerts: ended } });
      });
      return view(id);
    },

    async setEnabled(actor: Principal, id: number, enabled: boolean): Promise<RuleView> {
      await db.transaction(async (tx) => {
        const before = await locked(tx, id);
        if (before.enabled === enabled) return;
        await rulesRepo.setEnabled(tx, id, enabled, userId(actor));
        const ended = enabled ? 0 : await alertsRepo.closeForRule(tx, id, now(), 'rule_disabled');
        await auditRepo.record(tx, actor, { action: enabled ? 'rule.enable' : 'rule.disable', subjectType: 'alert_rule', subjectId: id, detail: { name: before.name, endedAlerts: ended } });
      });
      return view(id);
    },

    /** A disabled copy named "<name> (copy)", to edit into a sibling rule. */
    async duplicate(actor: Principal, id: number): Promise<RuleView> {
      const newId = await db.transaction(async (tx) => {
        const src = await rulesRepo.byId(tx, id);
        if (!src) throw new NotFoundError('Rule');
        const name = await rulesRepo.freeCopyName(tx, src.name);
        const doc: RuleDocument = { ...src.document, name, enabled: false };
        const copyId = await rulesRepo.insert(tx, { name, kind: doc.kind, serviceId: src.serviceId, document: doc, enabled: false }, userId(actor));
        await auditRepo.record(tx, actor, { action: 'rule.duplicate', subjectType: 'alert_rule', subjectId: copyId, detail: { from: id, name } });
        return copyId;
      });
      return view(newId);
    },

    async remove(actor: Principal, id: number): Promise<void> {
      await db.transaction(async (tx) => {
        const before = await locked(tx, id);
        await rulesRepo.softDelete(tx, id, userId(actor));
        const ended = await alertsRepo.closeForRule(tx, id, now(), 'rule_deleted');
        await auditRepo.record(tx, actor, { action: 'rule.delete', subjectType: 'alert_rule', subjectId: id, detail: { name: before.name, endedAlerts: ended } });
      });
    },

    resolver,
  };
}
