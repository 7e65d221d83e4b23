// Maintenance windows per service: engineers plan them; the evaluator keeps evaluating but sends
// nothing for the service while one is open and marks its alerts planned. Every change is audited.
import type { Knex } from 'knex';
import type { MaintenanceWindowInput, MaintenanceWindowView, UpdateMaintenanceWindowInput } from '../../shared/rules/api-schemas';
import type { Principal } from '../auth/principal';
import { NotFoundError, ValidationError } from '../errors';
import { auditRepo } from '../repositories/audit';
import { servicesRepo } from '../signals/repositories/services-repo';
import { maintenanceRepo } from './repositories/maintenance-repo';

export function maintenanceService(db: Knex, now: () => Date = () => new Date()) {
  async function view(id: number, tx: Knex = db): Promise<MaintenanceWindowView> {
    const w = await maintenanceRepo.byId(tx, id, now());
    if (!w) throw new NotFoundError('Maintenance window');
    return w;
  }
  return {
    list: (filter: { service?: string; current?: boolean }) => maintenanceRepo.list(db, now(), filter),
    get: (id: number) => view(id),

    async create(actor: Principal, input: MaintenanceWindowInput): Promise<MaintenanceWindowView> {
      const id = await db.transaction(async (tx) => {
        const serviceId = await servicesRepo.idByName(tx, input.service);
        if (serviceId === null) throw new ValidationError(`service: no service named ${input.service}`, 'service');
        const newId = await maintenanceRepo.insert(
          tx,
          { serviceId, startsAt: new Date(input.startsAt), endsAt: new Date(input.endsAt), reason: input.reason },
          actor.type === 'user' ? actor.id : null,
        );
        await auditRepo.record(tx, actor, {
          action: 'maintenance_window.create',
          subjectType: 'maintenance_window',
          subjectId: newId,
          detail: { service: input.service, startsAt: new Date(input.startsAt).toISOString(), endsAt: new Date(input.endsAt).toISOString() },
        });
        return newId;
      });
      return view(id);
    },

    async update(actor: Principal, id: number, patch: UpdateMaintenanceWindowInput): Promise<MaintenanceWindowView> {
      await db.transaction(async (tx) => {
        const before = await view(id, tx);
        const startsAt = patch.startsAt ?? Date.parse(before.startsAt);
        const endsAt = patch.endsAt ?? Date.parse(before.endsAt);
        if (endsAt <= startsAt) throw new ValidationError('endsAt: the window must end after it starts', 'endsAt');
        await maintenanceRepo.update(tx, id, {
          startsAt: patch.startsAt !== undefined ? new Date(patch.startsAt) : undefined,
          endsAt: patch.endsAt !== undefined ? new Date(patch.endsAt) : undefined,
          reason: patch.reason,
        });
        await auditRepo.record(tx, actor, { action: 'maintenance_window.update', subjectType: 'maintenance_window', subjectId: id, detail: { ...patch } });
      });
      return view(id);
    },

    async remove(actor: Principal, id: number): Promise<void> {
      await db.transaction(async (tx) => {
        const before = await view(id, tx);
        if (!(await maintenanceRepo.remove(tx, id))) throw new NotFoundError('Maintenance window');
        await auditRepo.record(tx, actor, { action: 'maintenance_window.delete', subjectType: 'maintenance_window', subjectId: id, detail: { service: before.service } });
      });
    },
  };
}
