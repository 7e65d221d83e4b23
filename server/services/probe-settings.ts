// Admin-managed prober settings: target rules (which addresses probes may reach) and run retention.
import type { Knex } from 'knex';
import { targetPolicySchema, type TargetPolicy } from '../../shared/journey/target-policy-schema';
import type { Principal } from '../auth/principal';
import { auditRepo } from '../repositories/audit';
import { settingsRepo } from '../repositories/settings';

export const DEFAULT_RUN_RETENTION_DAYS = 30;

export function probeSettingsService(db: Knex) {
  return {
    async targetPolicy(): Promise<TargetPolicy> {
      return targetPolicySchema.parse((await settingsRepo.get(db, 'target_policy')) ?? {});
    },
    async setTargetPolicy(actor: Principal, policy: TargetPolicy) {
      await db.transaction(async (tx) => {
        await settingsRepo.put(tx, 'target_policy', policy);
        await auditRepo.record(tx, actor, { action: 'settings.target_policy', subjectType: 'settings', subjectId: 'target_policy', detail: policy as unknown as Record<string, unknown> });
      });
    },
    async runRetentionDays(): Promise<number> {
      return (await settingsRepo.get<number>(db, 'run_retention_days')) ?? DEFAULT_RUN_RETENTION_DAYS;
    },
    async setRunRetentionDays(actor: Principal, days: number) {
      await db.transaction(async (tx) => {
        await settingsRepo.put(tx, 'run_retention_days', days);
        await auditRepo.record(tx, actor, { action: 'settings.run_retention', subjectType: 'settings', subjectId: 'run_retention_days', detail: { days } });
      });
    },
  };
}
