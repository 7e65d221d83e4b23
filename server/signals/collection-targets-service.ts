// Engineers manage the JSON endpoints the worker collects from; each change is audited.
import type { Knex } from 'knex';
import type { CollectionTargetInput, CollectionTargetView, UpdateCollectionTargetInput } from '../../shared/schemas/signals';
import type { Principal } from '../auth/principal';
import { ConflictError, NotFoundError } from '../errors';
import { auditRepo } from '../repositories/audit';
import { collectionTargetsRepo, type TargetWrite } from './repositories/collection-targets-repo';
import { servicesRepo } from './repositories/services-repo';

export function collectionTargetsService(db: Knex) {
  return {
    list(): Promise<CollectionTargetView[]> {
      return collectionTargetsRepo.list(db);
    },

    async create(actor: Principal, input: CollectionTargetInput): Promise<CollectionTargetView> {
      const id = await db.transaction(async (tx) => {
        const serviceId = await servicesRepo.ensure(tx, input.service);
        const { service: _service, ...rest } = input;
        const newId = await collectionTargetsRepo.insert(tx, { ...rest, serviceId }, actor.type === 'user' ? actor.id : null);
        if (newId === null) throw new ConflictError(`A collection target named ${input.name} already exists`, 'name');
        await auditRepo.record(tx, actor, { action: 'collection_target.create', subjectType: 'collection_target', subjectId: newId, detail: { name: input.name, url: input.url } });
        return newId;
      });
      return (await collectionTargetsRepo.byId(db, id))!;
    },

    async update(actor: Principal, id: number, patch: UpdateCollectionTargetInput): Promise<CollectionTargetView> {
      await db.transaction(async (tx) => {
        const { service, ...rest } = patch;
        const write: Partial<TargetWrite> = { ...rest };
        if (service !== undefined) write.serviceId = await servicesRepo.ensure(tx, service);
        const outcome = await collectionTargetsRepo.update(tx, id, write);
        if (outcome === 'missing') throw new NotFoundError('Collection target');
        if (outcome === 'conflict') throw new ConflictError(`A collection target named ${patch.name} already exists`, 'name');
        await auditRepo.record(tx, actor, { action: 'collection_target.update', subjectType: 'collection_target', subjectId: id, detail: patch });
      });
      return (await collectionTargetsRepo.byId(db, id))!;
    },

    async remove(actor: Principal, id: number): Promise<void> {
      await db.transaction(async (tx) => {
        const t = await collectionTargetsRepo.byId(tx, id);
        if (!t || !(await collectionTargetsRepo.remove(tx, id))) throw new NotFoundError('Collection target');
        await auditRepo.record(tx, actor, { action: 'collection_target.delete', subjectType: 'collection_target', subjectId: id, detail: { name: t.name } });
      });
    },
  };
}
