// The journey schemas bring the cron parser (and its date library) with them: more than the first
// page load should carry. Every form that checks with them gets them through this one dynamic
// import, so the web build keeps them in a single chunk of their own, loaded on first need. (A
// module that two chunks import statically would be moved into the chunk every page loads.)
export type JourneySchemas = typeof import('./journey-schema-bundle');

export function loadJourneySchemas(): Promise<JourneySchemas> {
  return import('./journey-schema-bundle');
}
