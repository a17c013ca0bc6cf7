import type { Routes } from '@angular/router';

export const routes: Routes = [
  { path: '', title: 'Bench · Benchtide', loadComponent: () => import('./bench/bench').then((m) => m.Bench) },
  { path: '**', redirectTo: '' },
];
