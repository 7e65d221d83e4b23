// Alert rules (issue 5): documents, pure evaluation, the state machine and replay, shared by the
// server (validation, replay, alert detail), the worker (evaluator) and the client (editor).
export * from './rule-schema';
export * from './label-groups';
export * from './state-machine';
export * from './evaluate-rule';
export * from './replay';
export * from './api-schemas';
