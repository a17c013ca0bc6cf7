import type { Routes } from '@angular/router';

export const routes: Routes = [
  { path: '', title: 'Bench · Benchtide', loadComponent: () => import('./bench/bench').then((m) => m.Bench) },
  {
    path: 'pour-planner',
    title: 'Pour planner · Benchtide',
    loadComponent: () => import('./pours/pour-planner').then((m) => m.PourPlanner),
  },
  {
    path: 'scale-tools',
    title: 'Scale tools · Benchtide',
    loadComponent: () => import('./scale-tools/scale-tools').then((m) => m.ScaleTools),
  },
  { path: '**', redirectTo: '' },
];
