// Checks the form with the same schema the server uses. The schemas come in as an argument: they
// are loaded on demand (components/forms/journey-schemas.ts) because they carry the cron parser.
import { isApiError } from '../../../hooks/api-client';
import type { JourneyDocument } from '../../../shared/journey/journey-schema';
import type { Schedule } from '../../../shared/journey/schedule-schema';
import type { JourneySchemas } from '../../forms/journey-schemas';
import { documentFromDraft, scheduleFromDraft, type JourneyDraft } from './draft';

/** Problems keyed by the field's path in the document: "name", "steps.0.url", "schedule.everySeconds". */
export type DraftErrors = Record<string, string>;

function collect(issues: ReadonlyArray<{ path: readonly PropertyKey[]; message: string }>): DraftErrors {
  const errors: DraftErrors = {};
  for (const issue of issues) {
    const key = issue.path.map(String).join('.') || 'form';
    if (errors[key] === undefined) errors[key] = issue.message;
  }
  return errors;
}

export type DraftCheck = { ok: true; document: JourneyDocument } | { ok: false; errors: DraftErrors };

export function checkDraft(schemas: JourneySchemas, draft: JourneyDraft): DraftCheck {
  const result = schemas.journeyDocumentSchema.safeParse(documentFromDraft(draft));
  return result.success ? { ok: true, document: result.data } : { ok: false, errors: collect(result.error.issues) };
}

/** "Try it now" runs from one vantage, so the draft need not have its vantages chosen yet. */
export function checkDraftForTry(schemas: JourneySchemas, draft: JourneyDraft, vantage: string): DraftCheck {
  return checkDraft(schemas, { ...draft, vantages: [vantage], failureQuorum: '1' });
}

export function checkSchedule(schemas: JourneySchemas, draft: JourneyDraft): Schedule | null {
  const result = schemas.scheduleSchema.safeParse(scheduleFromDraft(draft));
  return result.success ? result.data : null;
}

/**
 * The field a server refusal names, as a form path: `document.steps.0.url` → `steps.0.url`,
 * `serviceIds.1` → `serviceIds`. Null when it names none.
 */
export function serverDraftErrors(error: unknown): DraftErrors | null {
  if (!isApiError(error) || !error.field) return null;
  const path = error.field.replace(/^document\./, '').replace(/^serviceIds\.\d+$/, 'serviceIds');
  // The server prefixes its messages with the path; the field already says where.
  const message = error.message.replace(/^[\w.]+: /, '');
  return { [path]: message };
}

/** Where a path is, in words: "steps.0.assertions.1.in" → "Step 1 › assertion 2 › in". */
export function describePath(path: string): string {
  const parts = path.split('.');
  const words: string[] = [];
  const singular: Record<string, string> = { steps: 'Step', assertions: 'assertion', captures: 'capture', headers: 'header', vantages: 'vantage' };
  for (let i = 0; i < parts.length; i++) {
    const part = parts[i]!;
    const next = parts[i + 1];
    if (singular[part] && next !== undefined && /^\d+$/.test(next)) {
      words.push(`${singular[part]} ${Number(next) + 1}`);
      i++;
    } else if (!/^\d+$/.test(part)) {
      words.push(part === 'form' ? 'Journey' : part);
    }
  }
  return words.join(' › ');
}

/** The first problem at a path or inside it. */
export function errorUnder(errors: DraftErrors, path: string): string | undefined {
  if (errors[path]) return errors[path];
  const prefix = `${path}.`;
  const key = Object.keys(errors).find((k) => k.startsWith(prefix));
  return key ? errors[key] : undefined;
}
