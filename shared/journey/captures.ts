import { evaluateJsonPath } from './json-path';
import { type ObservedResponse, headerValues, jsonBody } from './observed-response';
import type { Capture } from './step-schema';

export type CaptureResult =
  | { ok: true; values: Record<string, string> }
  | { ok: false; values: Record<string, string>; name: string; reason: string };

function asText(value: unknown): string {
  return typeof value === 'string' ? value : JSON.stringify(value);
}

function captureOne(capture: Capture, response: ObservedResponse): string | { reason: string } {
  switch (capture.from) {
    case 'json': {
      const body = jsonBody(response);
      if (!body.ok) return { reason: body.reason };
      const found = evaluateJsonPath(body.value, capture.path);
      return found.found ? asText(found.value) : { reason: `${capture.path} is absent from the body` };
    }
    case 'header': {
      const values = headerValues(response, capture.header);
      if (values.length === 0) return { reason: `header ${capture.header} is absent` };
      if (!capture.pattern) return values.join(', ');
      // Repeated headers (set-cookie) are tried one by one: the pattern names which one.
      for (const value of values) {
        const match = new RegExp(capture.pattern).exec(value);
        if (match) return match[1] ?? match[0];
      }
      return { reason: `no ${capture.header} header matches /${capture.pattern}/` };
    }
    case 'regex': {
      const match = new RegExp(capture.pattern, capture.flags).exec(response.bodyText);
      if (!match) return { reason: `body does not match /${capture.pattern}/` };
      const value = match[capture.group];
      return value === undefined ? { reason: `group ${capture.group} of /${capture.pattern}/ did not take part in the match` } : value;
    }
  }
}

/** Takes every capture of a step in order; stops at the first one that finds nothing. */
export function extractCaptures(captures: readonly Capture[], response: ObservedResponse): CaptureResult {
  const values: Record<string, string> = {};
  for (const capture of captures) {
    const result = captureOne(capture, response);
    if (typeof result !== 'string') return { ok: false, values, name: capture.name, reason: result.reason };
    values[capture.name] = result;
  }
  return { ok: true, values };
}
