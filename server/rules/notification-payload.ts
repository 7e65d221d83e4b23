// What a notification says, frozen at the transition that caused it: a retried delivery sends
// exactly the same message, even if the rule was edited since.
import type { Labels } from '../../shared/rules/label-groups';
import { describeCondition, type RuleDocument, type Severity } from '../../shared/rules/rule-schema';
import type { NoDataReason } from '../../shared/rules/state-machine';

/** The transitions people are told about. */
export type NotifiedTransition = 'raised' | 'cleared' | 'no_data';

export interface NotificationPayload {
  alertId: number;
  ruleId: number;
  ruleName: string;
  service: string;
  kind: RuleDocument['kind'];
  severity: Severity;
  transition: NotifiedTransition;
  /** Responder note first: what the person alerted should check or do first. */
  responderNote: string;
  runbookUrl: string | null;
  condition: string;
  labels: Labels;
  value: number | null;
  /** The instant of the transition (ISO 8601). */
  at: string;
  openedAt: string;
  raisedAt: string | null;
  /** cleared: how it ended; no_data: why. */
  reason: string | null;
}

export function buildPayload(input: {
  alertId: number;
  ruleId: number;
  service: string;
  rule: RuleDocument;
  transition: NotifiedTransition;
  labels: Labels;
  value: number | null;
  at: number;
  openedAt: number;
  raisedAt: number | null;
  endReason?: string | null;
  noDataReason?: NoDataReason | null;
}): NotificationPayload {
  return {
    alertId: input.alertId,
    ruleId: input.ruleId,
    ruleName: input.rule.name,
    service: input.service,
    kind: input.rule.kind,
    severity: input.rule.severity,
    transition: input.transition,
    responderNote: input.rule.responderNote,
    runbookUrl: input.rule.runbookUrl ?? null,
    condition: describeCondition(input.rule),
    labels: input.labels,
    value: input.value !== null && Number.isFinite(input.value) ? input.value : null,
    at: new Date(input.at).toISOString(),
    openedAt: new Date(input.openedAt).toISOString(),
    raisedAt: input.raisedAt === null ? null : new Date(input.raisedAt).toISOString(),
    reason: input.transition === 'cleared' ? (input.endReason ?? null) : input.transition === 'no_data' ? (input.noDataReason ?? 'no_data') : null,
  };
}

/** Links back into the app (PARALLAX_PUBLIC_URL, default the local server). */
export function publicUrlFromEnv(env: NodeJS.ProcessEnv = process.env): string {
  return (env.PARALLAX_PUBLIC_URL ?? 'http://127.0.0.1:8080').replace(/\/+$/, '');
}

export function alertLinks(publicUrl: string, p: Pick<NotificationPayload, 'alertId' | 'ruleId'>) {
  return { alert: `${publicUrl}/alerts/${p.alertId}`, rule: `${publicUrl}/alerts/rules/${p.ruleId}` };
}
