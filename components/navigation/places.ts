import type { Href } from 'expo-router';
import type { IconName } from '../ui/icon';

export interface Place {
  /** Route name inside app/(app). */
  name: string;
  href: Href;
  path: string;
  title: string;
  icon: IconName;
  testID: string;
}

/** The top-level places of DESIGN.md §9, in the order they are shown. */
export const PLACES: readonly Place[] = [
  { name: 'index', href: '/', path: '/', title: 'Now', icon: 'clock', testID: 'nav-now' },
  { name: 'journeys', href: '/journeys', path: '/journeys', title: 'Journeys', icon: 'map', testID: 'nav-journeys' },
  { name: 'signals', href: '/signals', path: '/signals', title: 'Signals', icon: 'activity', testID: 'nav-signals' },
  { name: 'alerts', href: '/alerts', path: '/alerts', title: 'Alerts', icon: 'bell', testID: 'nav-alerts' },
  { name: 'findings', href: '/findings', path: '/findings', title: 'Findings', icon: 'eye', testID: 'nav-findings' },
  { name: 'releases', href: '/releases', path: '/releases', title: 'Releases', icon: 'package', testID: 'nav-releases' },
  { name: 'settings', href: '/settings', path: '/settings', title: 'Settings', icon: 'sliders', testID: 'nav-settings' },
];

export function placeForRoute(name: string): Place | undefined {
  return PLACES.find((place) => place.name === name);
}
