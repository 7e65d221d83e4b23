// Inputs and views of the alerting API: replay, alerts, maintenance windows, webhook channels and
// outgoing mail (issue 5). The server validates with these; the client's forms use the same.
import { z } from 'zod';
import { durationSchema, instantSchema, serviceNameSchema } from '../schemas/signals';
import type { Labels } from './label-groups';
import type { ReplayResult } from './replay';
import { httpUrlSchema, ruleDocumentSchema, type RuleDocument, type RuleKind, type Severity } from './rule-schema';
import type { NoDataReason, OpenAlertState, TransitionKind } from './state-machine';

export const DEFAULT_REPLAY_MS = 7 * 86_400_000;
export const MAX_REPLAY_MS = 31 * 86_400_000;

export const replayRequestSchema = z
  .object({
    rule: ruleDocumentSchema,
    /** Default: `to` − 7 days. */
    from: instantSchema.optional(),
    /** Default: now. */
    to: instantSchema.optional(),
    /** Default: the evaluator's cycle, coarsened to keep the number of steps bounded. */
    step: durationSchema.optional(),
  })
  .superRefine((r, ctx) => {
    if (r.from !== undefined && r.to !== undefined && r.from >= r.to) ctx.addIssue({ code: 'custom', path: ['from'], message: 'from must be before to' });
  });
export type ReplayRequest = z.infer<typeof replayRequestSchema>;

export interface ReplayResponse extends ReplayResult {
  service: string;
  signal: string;
  unit: string;
  /** Median gap between samples (null with too few to tell). */
  samplingIntervalMs: number | null;
  warnings: string[];
}

// ---------------------------------------------------------------------------------------------
// Rules
// ---------------------------------------------------------------------------------------------

export interface RuleView {
  id: number;
  document: RuleDocument;
  name: string;
  kind: RuleKind;
  service: string;
  enabled: boolean;
  severity: Severity;
  /** A sentence describing the condition. */
  condition: string;
  version: number;
  createdAt: string;
  updatedAt: string;
  /** Open alerts of the rule by state. */
  open: { pending: number; raised: number; noData: number };
}

export const rulesListQuerySchema = z.object({
  service: serviceNameSchema.optional(),
  enabled: z.enum(['true', 'false']).optional(),
});

// ---------------------------------------------------------------------------------------------
// Alerts
// ---------------------------------------------------------------------------------------------

export type AlertState = OpenAlertState | 'cleared';

export interface AlertView {
  id: number;
  ruleId: number;
  ruleName: string;
  kind: RuleKind;
  service: string;
  severity: Severity;
  /** First, on every screen and in every message. */
  responderNote: string;
  runbookUrl: string | null;
  condition: string;
  labels: Labels;
  state: AlertState;
  /** no_data: why (no samples, no traffic, too few peers). */
  noDataReason: NoDataReason | null;
  /** The alert was raised while it was held through no data. */
  heldRaised: boolean;
  value: number | null;
  /** Opened or raised during a maintenance window of the service: not notified. */
  planned: boolean;
  openedAt: string;
  pendingSince: string | null;
  raisedAt: string | null;
  clearedAt: string | null;
  /** cleared: how it ended (condition false for the clear time, never raised, rule changed...). */
  endReason: string | null;
  lastEvaluatedAt: string | null;
}

export const alertsListQuerySchema = z.object({
  limit: z.coerce.number().int().min(1, 'limit must be at least 1').max(200, 'limit must be at most 200').default(50),
  /** History page cursor: the id of the last alert of the previous page. */
  before: z.coerce.number().int().positive().optional(),
  ruleId: z.coerce.number().int().positive().optional(),
  service: serviceNameSchema.optional(),
  /** Include ended alerts that never raised (pending blips, no-data stretches) in the history. */
  all: z.enum(['true', 'false']).optional(),
});
export type AlertsListQuery = z.infer<typeof alertsListQuerySchema>;

export interface AlertsList {
  /** Open now: raised first, then no data, then pending; newest first within each. */
  now: AlertView[];
  /** Ended alerts, newest first. */
  history: AlertView[];
  nextBefore: number | null;
}

export interface AlertEventView {
  at: string;
  transition: TransitionKind;
  state: AlertState;
  value: number | null;
}

export interface AlertSpanView {
  state: OpenAlertState;
  from: string;
  to: string | null;
}

export interface AlertDetail {
  alert: AlertView;
  events: AlertEventView[];
  /** The recorded state spans (from the alert's events). */
  spans: AlertSpanView[];
  /** The rule's value for this group around the alert, by the same evaluation (null: could not load). */
  series: { from: number; to: number; stepMs: number; points: Array<{ t: number; v: number | null }> } | null;
  warnings: string[];
}

// ---------------------------------------------------------------------------------------------
// Maintenance windows
// ---------------------------------------------------------------------------------------------

const windowFields = {
  service: serviceNameSchema,
  startsAt: instantSchema,
  endsAt: instantSchema,
  reason: z.string().trim().max(2000).default(''),
};

export const maintenanceWindowSchema = z.object(windowFields).superRefine((w, ctx) => {
  if (w.endsAt <= w.startsAt) ctx.addIssue({ code: 'custom', path: ['endsAt'], message: 'the window must end after it starts' });
});
export type MaintenanceWindowInput = z.infer<typeof maintenanceWindowSchema>;

export const updateMaintenanceWindowSchema = z
  .object({ startsAt: windowFields.startsAt, endsAt: windowFields.endsAt, reason: z.string().trim().max(2000) })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change: give startsAt, endsAt or reason' });
export type UpdateMaintenanceWindowInput = z.infer<typeof updateMaintenanceWindowSchema>;

export const maintenanceListQuerySchema = z.object({
  service: serviceNameSchema.optional(),
  /** Only windows that have not ended by now. */
  current: z.enum(['true', 'false']).optional(),
});

export interface MaintenanceWindowView {
  id: number;
  service: string;
  startsAt: string;
  endsAt: string;
  reason: string;
  /** Active at the time of the answer. */
  active: boolean;
  createdBy: string | null;
  createdAt: string;
}

// ---------------------------------------------------------------------------------------------
// Webhook channels
// ---------------------------------------------------------------------------------------------

/** A webhook address: a full http or https URL, the same rule as a runbook link. */
export const webhookUrlSchema = httpUrlSchema;

export const channelSchema = z.object({
  name: z.string().trim().min(1, 'Give the channel a name').max(120),
  url: webhookUrlSchema,
  enabled: z.boolean().default(true),
});
export type ChannelInput = z.infer<typeof channelSchema>;

export const updateChannelSchema = z
  .object({
    name: channelSchema.shape.name,
    url: webhookUrlSchema,
    enabled: z.boolean(),
    /** A new secret is made and shown once in the answer. */
    rotateSecret: z.literal(true),
  })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateChannelInput = z.infer<typeof updateChannelSchema>;

export interface ChannelView {
  id: number;
  kind: 'webhook';
  name: string;
  url: string;
  enabled: boolean;
  /** The first characters of the secret, to tell secrets apart; never the secret itself. */
  secretHint: string;
  createdAt: string;
  updatedAt: string;
}

/** Answer to create (and to a secret rotation): the only time the secret is shown. */
export interface ChannelWithSecret extends ChannelView {
  secret: string;
}

// ---------------------------------------------------------------------------------------------
// Outgoing mail (Settings → Outgoing mail: what the local SMTP sink received)
// ---------------------------------------------------------------------------------------------

export const outgoingMailQuerySchema = z.object({
  limit: z.coerce.number().int().min(1, 'limit must be at least 1').max(500, 'limit must be at most 500').default(50),
});

export interface OutgoingMailItem {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
}

export interface OutgoingMailList {
  /** Newest first. */
  items: OutgoingMailItem[];
  total: number;
}
