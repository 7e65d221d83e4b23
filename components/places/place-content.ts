import type { Href } from 'expo-router';

export interface PlaceIntro {
  title: string;
  /** What will live in this place. */
  purpose: string;
  /** Honest state: why it is empty today. */
  emptyTitle: string;
  emptyBody: string;
  /** What to do first, in order. */
  firstSteps: string[];
  link?: { href: Href; label: string; adminOnly?: boolean };
}

// Words from DESIGN.md §3. Nothing here pretends data exists.
export const PLACE_INTROS = {
  journeys: {
    title: 'Journeys',
    purpose:
      'Scripted walks through your service the way a customer uses it, such as sign in, search, reserve and pay. Each journey has steps with assertions, runs on a schedule from one or more vantages, and keeps every run with its verdict and step timings.',
    emptyTitle: 'No journeys yet',
    emptyBody: 'Writing and importing journeys arrives in a coming release of Parallax; runs, verdicts and step timings will show up here.',
    firstSteps: [
      'List the three or four paths customers depend on most, and the services each one exercises.',
      'Make a test account on the service for probing. Never run steps that change real data in production without one.',
      'Ask the service owner before probing systems you do not own, and respect their rate limits.',
    ],
  },
  signals: {
    title: 'Signals',
    purpose:
      "Your services and their internal metrics: request and error counters, latency histograms and gauges such as free disk. Each signal's label sets make series you can explore here.",
    emptyTitle: 'No services are sending metrics',
    emptyBody: 'Metrics intake (OTLP over HTTP with JSON, plain JSON and CSV uploads) arrives in a coming release.',
    firstSteps: [
      'Find where each service counts requests and errors and measures latency.',
      'Create an access token with the "Send metrics" scope for each service that will send them.',
    ],
    link: { href: '/settings/tokens', label: 'Go to Access tokens', adminOnly: true },
  },
  alerts: {
    title: 'Alerts',
    purpose:
      'Alert rules are conditions on signals with a sustain time, a severity and a responder note that says what the person paged should check first. Alerts raised now, their history and the rules live here.',
    emptyTitle: 'No alert rules yet',
    emptyBody: 'Rules need signals to watch, so this stays empty until a service sends its metrics.',
    firstSteps: [
      'Connect a service\'s metrics first (see Signals).',
      'For each page you already send, write down what the responder should check first; every rule needs that note.',
    ],
    link: { href: '/signals', label: 'Go to Signals' },
  },
  findings: {
    title: 'Findings',
    purpose:
      'Every stretch of customer-visible failure is an episode. Each closed episode is classed as caught (an internal alert saw it), quiet (the metrics moved but no rule alerted) or dark (nothing inside moved). Coverage and the tuning list live here.',
    emptyTitle: 'No episodes yet',
    emptyBody: 'Findings appear after journeys have run and a failing stretch has closed. Nothing has run yet.',
    firstSteps: ['Add a journey, so there is something to compare.', "Connect a service's metrics, so there is something to compare it with."],
    link: { href: '/journeys', label: 'Go to Journeys' },
  },
  releases: {
    title: 'Releases',
    purpose:
      'Deploy markers for your services and release watches: a before and after comparison of the journeys that exercise a released service, with the verdict steady, suspect or regressed.',
    emptyTitle: 'No releases recorded',
    emptyBody: 'Recording releases by hand or from a delivery pipeline arrives in a coming release.',
    firstSteps: [
      'Decide which pipeline step should record a release (after the deploy finishes is usual).',
      'Create an access token with the "Record releases" scope for that pipeline.',
    ],
    link: { href: '/settings/tokens', label: 'Go to Access tokens', adminOnly: true },
  },
} satisfies Record<string, PlaceIntro>;

export type PlaceKey = keyof typeof PLACE_INTROS;
