/**
 * Step templates: `{{name}}` inserts a variable captured by an earlier step, `{{secret.NAME}}`
 * inserts a stored secret. Spaces inside the braces are allowed (`{{ name }}`). Values are inserted
 * as they are (no URL or JSON escaping), so a template author decides where encoding belongs.
 */

export const TEMPLATE_NAME_PATTERN = /^[A-Za-z_][A-Za-z0-9_]*$/;

const PLACEHOLDER = /\{\{(.*?)\}\}/g;

export type TemplateRef = { kind: 'variable'; name: string } | { kind: 'secret'; name: string };

export class TemplateError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'TemplateError';
  }
}

function parseRef(inner: string, template: string): TemplateRef {
  const body = inner.trim();
  const isSecret = body.startsWith('secret.');
  const name = isSecret ? body.slice('secret.'.length) : body;
  if (!TEMPLATE_NAME_PATTERN.test(name)) {
    throw new TemplateError(
      `"{{${inner}}}" in "${template}" is not a valid placeholder: use {{name}} or {{secret.NAME}} (letters, digits, _)`,
    );
  }
  return isSecret ? { kind: 'secret', name } : { kind: 'variable', name };
}

/** Every placeholder in a template, in order; throws TemplateError on a malformed one. */
export function templateRefs(template: string): TemplateRef[] {
  const refs: TemplateRef[] = [];
  for (const match of template.matchAll(PLACEHOLDER)) refs.push(parseRef(match[1], template));
  return refs;
}

export interface TemplateContext {
  variables: Readonly<Record<string, string>>;
  secrets: Readonly<Record<string, string>>;
}

export function renderTemplate(template: string, context: TemplateContext): string {
  return template.replace(PLACEHOLDER, (_whole, inner: string) => {
    const ref = parseRef(inner, template);
    if (ref.kind === 'secret') {
      if (!Object.prototype.hasOwnProperty.call(context.secrets, ref.name)) {
        throw new TemplateError(`unknown secret "${ref.name}": add it under Settings → Secrets`);
      }
      return context.secrets[ref.name];
    }
    if (!Object.prototype.hasOwnProperty.call(context.variables, ref.name)) {
      throw new TemplateError(`unknown variable "${ref.name}": no earlier step captured it`);
    }
    return context.variables[ref.name];
  });
}

/** The template strings of one step (URL, header values, body). */
export interface TemplatedStep {
  url: string;
  headers: ReadonlyArray<{ value: string }>;
  body?: string | null;
}

export function stepTemplates(step: TemplatedStep): string[] {
  return [step.url, ...step.headers.map((h) => h.value), ...(step.body ? [step.body] : [])];
}

/** Secret names a journey references, sorted and without duplicates. */
export function referencedSecretNames(steps: ReadonlyArray<TemplatedStep>): string[] {
  const names = new Set<string>();
  for (const step of steps) {
    for (const template of stepTemplates(step)) {
      for (const ref of templateRefs(template)) if (ref.kind === 'secret') names.add(ref.name);
    }
  }
  return [...names].sort();
}
