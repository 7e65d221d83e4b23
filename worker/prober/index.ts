export { classifyRequestError } from './classify-error';
export {
  type ConnectionRecord,
  type ProbeAgent,
  type ProbeAgentOptions,
  ProbeConnectError,
  type Resolver,
  createProbeAgent,
  systemResolver,
} from './probe-agent';
export { type Clock, type ProbeAgentFactory, type RunJourneyOptions, runJourney } from './run-journey';
export { MAX_BODY_BYTES, responseExcerpt } from './run-step';
export { METADATA_ADDRESSES, type TargetGuard, createTargetGuard, normalizeAddress } from './target-guard';
