// Services and their signals as people see them: the Services list, the signal list of one
// service, and engineers describing a service (every change recorded in the audit log).
import type { Knex } from 'knex';
import type { CreateServiceInput, ServiceView, SignalView, UpdateServiceInput } from '../../shared/schemas/signals';
import type { Principal } from '../auth/principal';
import { ConflictError, NotFoundError } from '../errors';
import { auditRepo } from '../repositories/audit';
import { servicesRepo } from './repositories/services-repo';
import { signalsRepo } from './repositories/signals-repo';

export function servicesService(db: Knex) {
  return {
    list(): Promise<ServiceView[]> {
      return servicesRepo.list(db);
    },

    async create(actor: Principal, input: CreateServiceInput): Promise<ServiceView> {
      const id = await db.transaction(async (tx) => {
        const newId = await servicesRepo.insert(tx, input);
        if (newId === null) throw new ConflictError(`A service named ${input.name} already exists`, 'name');
        await auditRepo.record(tx, actor, { action: 'service.create', subjectType: 'service', subjectId: newId, detail: { name: input.name } });
        return newId;
      });
      return (await servicesRepo.byId(db, id))!;
    },

    async update(actor: Principal, id: number, patch: UpdateServiceInput): Promise<ServiceView> {
      await db.transaction(async (tx) => {
        if (!(await servicesRepo.update(tx, id, patch))) throw new NotFoundError('Service');
        await auditRepo.record(tx, actor, { action: 'service.update', subjectType: 'service', subjectId: id, detail: patch });
      });
      return (await servicesRepo.byId(db, id))!;
    },

    async signals(service: string): Promise<SignalView[]> {
      const id = await servicesRepo.idByName(db, service);
      if (id === null) throw new NotFoundError(`Service ${service}`);
      return signalsRepo.listForService(db, id, service);
    },
  };
}
