import type { Knex } from 'knex';
import type { JourneyDocument } from '../../shared/journey/journey-schema';
import { referencedSecretNames } from '../../shared/journey/template';
import type { JourneySummary } from '../../shared/schemas/journeys';
import { wilsonInterval } from '../../shared/stats/wilson-interval';
import type { Principal } from '../auth/principal';
import { NotFoundError, ValidationError } from '../errors';
import { auditRepo } from '../repositories/audit';
import { journeysRepo } from '../repositories/journeys';
import { runsRepo } from '../repositories/runs';
import { vantagesRepo } from '../repositories/vantages';

const actorId = (p: Principal) => (p.type === 'user' ? p.id : null);

export function journeysService(db: Knex, now: () => Date = () => new Date()) {
  /** References must point at things that exist, or the journey could never run as saved. */
  async function checkReferences(tx: Knex, doc: JourneyDocument, serviceIds: number[]) {
    const known = new Set(await vantagesRepo.names(tx));
    doc.vantages.forEach((v, i) => {
      if (!known.has(v)) throw new ValidationError(`document.vantages.${i}: no vantage named ${v} (add it in Settings → Vantages)`, `document.vantages.${i}`);
    });
    const secretNames = referencedSecretNames(doc.steps);
    if (secretNames.length) {
      const have = new Set((await tx('secrets').whereIn('name', secretNames).select('name')).map((r) => r.name as string));
      const missing = secretNames.filter((n) => !have.has(n));
      if (missing.length) throw new ValidationError(`document.steps: no secret named ${missing.join(', ')} (add it in Settings → Secrets)`, 'document.steps');
    }
    if (serviceIds.length) {
      const have = new Set((await tx('services').whereIn('id', serviceIds).select('id')).map((r) => Number(r.id)));
      serviceIds.forEach((id, i) => {
        if (!have.has(id)) throw new ValidationError(`serviceIds.${i}: no service with id ${id}`, `serviceIds.${i}`);
      });
    }
  }

  return {
    async list(): Promise<JourneySummary[]> {
      const [journeys, stats] = await Promise.all([journeysRepo.listCurrent(db), runsRepo.stats(db, new Date(now().getTime() - 24 * 3600_000))]);
      return journeys.map((j) => {
        const s = stats.byJourney.get(j.id) ?? { passed: 0, total: 0, p95: null };
        const w = wilsonInterval(s.passed, s.total);
        return {
          id: j.id,
          name: j.name,
          version: j.version,
          enabled: j.enabled,
          vantages: j.document.vantages,
          schedule: j.document.schedule,
          lastRun: stats.last.get(j.id) ?? null,
          passRate: { passed: s.passed, total: s.total, rate: w?.estimate ?? null, low: w?.lower ?? null, high: w?.upper ?? null },
          p95TotalMs: s.p95,
        };
      });
    },

    async get(id: number, version?: number) {
      const j = await journeysRepo.byId(db, id, version);
      if (!j) throw new NotFoundError(version ? `Version ${version} of journey ${id}` : 'Journey');
      return { ...j, versions: await journeysRepo.versions(db, id), vantageStates: await runsRepo.vantageStates(db, id) };
    },

    async create(actor: Principal, doc: JourneyDocument, serviceIds: number[]) {
      const id = await db.transaction(async (tx) => {
        await checkReferences(tx, doc, serviceIds);
        const newId = await journeysRepo.insert(tx, doc, actorId(actor));
        await journeysRepo.setServices(tx, newId, serviceIds);
        await auditRepo.record(tx, actor, { action: 'journey.create', subjectType: 'journey', subjectId: newId, detail: { name: doc.name, version: 1 } });
        return newId;
      });
      return (await journeysRepo.byId(db, id))!;
    },

    async update(actor: Principal, id: number, doc: JourneyDocument, serviceIds: number[]) {
      await db.transaction(async (tx) => {
        await checkReferences(tx, doc, serviceIds);
        const version = await journeysRepo.addVersion(tx, id, doc, actorId(actor));
        if (version === null) throw new NotFoundError('Journey');
        await journeysRepo.setServices(tx, id, serviceIds);
        await auditRepo.record(tx, actor, { action: 'journey.update', subjectType: 'journey', subjectId: id, detail: { name: doc.name, version } });
      });
      return (await journeysRepo.byId(db, id))!;
    },

    async remove(actor: Principal, id: number) {
      await db.transaction(async (tx) => {
        if (!(await journeysRepo.remove(tx, id))) throw new NotFoundError('Journey');
        await auditRepo.record(tx, actor, { action: 'journey.delete', subjectType: 'journey', subjectId: id });
      });
    },
  };
}
