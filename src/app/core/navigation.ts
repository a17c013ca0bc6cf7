/** Where an entry shows: in both, only on the wide rail, or only in the phone's bottom bar. */
export type NavigationPlace = 'both' | 'rail' | 'bar';

/** The screens in the navigation, in the order a modeller reaches for them. */
export interface NavigationEntry {
  path: string;
  label: string;
  icon: string;
  place: NavigationPlace;
}

/**
 * A phone's bottom bar holds five entries at most: the four daily screens and "More", which lists the
 * rest. The rail on a wide screen has room for every screen and no need of "More".
 */
export const NAVIGATION: readonly NavigationEntry[] = [
  { path: '/', label: 'Bench', icon: 'bench', place: 'both' },
  { path: '/builds', label: 'Builds', icon: 'builds', place: 'both' },
  { path: '/shelf', label: 'Shelf', icon: 'shelf', place: 'both' },
  { path: '/costs', label: 'Costs', icon: 'costs', place: 'both' },
  { path: '/pour-planner', label: 'Pour planner', icon: 'pour', place: 'rail' },
  { path: '/scale-tools', label: 'Scale tools', icon: 'scale', place: 'rail' },
  { path: '/workshop', label: 'Workshop', icon: 'workshop', place: 'rail' },
  { path: '/more', label: 'More', icon: 'more', place: 'bar' },
];

/** What "More" lists on a phone: the rail-only screens, then this device. */
export const MORE_ENTRIES: readonly Omit<NavigationEntry, 'place'>[] = [
  ...NAVIGATION.filter((entry) => entry.place === 'rail'),
  { path: '/device', label: 'This device', icon: 'sync' },
  { path: '/account', label: 'Account', icon: 'workshop' },
];
