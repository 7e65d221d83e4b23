// What a notification says, by mail and by webhook, from the payload frozen at the transition.
// The responder note comes first: it is what the person woken at 3 a.m. needs before anything else.
import { formatLabels } from '../../shared/rules/label-groups';
import { alertLinks, type NotificationPayload } from '../../server/rules/notification-payload';

const TITLES = { raised: 'Raised', cleared: 'Cleared', no_data: 'No data' } as const;

const REASONS: Record<string, string> = {
  cleared: 'the condition was false for the clear time',
  series_gone: 'no series of this group report any more',
  no_data: 'no samples in the window',
  no_traffic: 'no traffic in the window (not the same as 0 %)',
  too_few_peers: 'too few peers with data to compare against',
};

export function formatValue(v: number | null): string {
  if (v === null) return 'none';
  if (Number.isInteger(v)) return String(v);
  const a = Math.abs(v);
  return a !== 0 && (a < 0.001 || a >= 1e6) ? v.toExponential(4) : String(Number(v.toPrecision(6)));
}

/** A per-message id that stays the same on every retry (receivers can drop duplicates by it). */
export function deliveryId(outboxId: number): string {
  return `parallax-outbox-${outboxId}`;
}

export function mailMessage(p: NotificationPayload, outboxId: number, publicUrl: string) {
  const links = alertLinks(publicUrl, p);
  const group = formatLabels(p.labels);
  const subject = `[${p.severity.toUpperCase()}] ${TITLES[p.transition]}: ${p.ruleName} — ${group}`;
  const lines = [
    'Responder note (check or do this first):',
    p.responderNote,
    '',
    `${TITLES[p.transition]}: ${p.ruleName}`,
    `Service: ${p.service}`,
    `Group: ${group}`,
    `Value: ${formatValue(p.value)}`,
    `Condition: ${p.condition}`,
    `Severity: ${p.severity}`,
    `At: ${p.at}`,
    `Open since: ${p.openedAt}${p.raisedAt ? `, raised at ${p.raisedAt}` : ''}`,
  ];
  if (p.reason) lines.push(`Why: ${REASONS[p.reason] ?? p.reason}`);
  lines.push('');
  if (p.runbookUrl) lines.push(`Runbook: ${p.runbookUrl}`);
  lines.push(`Alert: ${links.alert}`, `Rule: ${links.rule}`, '', `Message ${deliveryId(outboxId)} (a retry carries the same id).`);
  const domain = (() => {
    try {
      return new URL(publicUrl).hostname || 'parallax.local';
    } catch {
      return 'parallax.local';
    }
  })();
  return { subject, text: `${lines.join('\n')}\n`, messageId: `<${deliveryId(outboxId)}@${domain}>` };
}

export function webhookBody(p: NotificationPayload, outboxId: number, publicUrl: string): string {
  return JSON.stringify({
    id: deliveryId(outboxId),
    event: `alert.${p.transition}`,
    at: p.at,
    alert: {
      id: p.alertId,
      transition: p.transition,
      labels: p.labels,
      value: p.value,
      openedAt: p.openedAt,
      raisedAt: p.raisedAt,
      reason: p.reason,
    },
    rule: {
      id: p.ruleId,
      name: p.ruleName,
      service: p.service,
      kind: p.kind,
      severity: p.severity,
      condition: p.condition,
      responderNote: p.responderNote,
      runbookUrl: p.runbookUrl,
    },
    links: alertLinks(publicUrl, p),
  });
}
