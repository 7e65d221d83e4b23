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
