/** The screens in the navigation, in the order a modeller reaches for them. */
export interface NavigationEntry {
  path: string;
  label: string;
  icon: string;
}

export const NAVIGATION: readonly NavigationEntry[] = [
  { path: '/', label: 'Bench', icon: 'bench' },
  { path: '/pour-planner', label: 'Pour planner', icon: 'pour' },
  { path: '/scale-tools', label: 'Scale tools', icon: 'scale' },
  { path: '/workshop', label: 'Workshop', icon: 'workshop' },
];
