import type { Routes } from '@angular/router';
import { signedInGuard } from './account/signed-in-guard';

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
  {
    path: 'builds',
    title: 'Builds · Benchtide',
    loadComponent: () => import('./builds/build-list').then((m) => m.BuildList),
  },
  {
    path: 'builds/new',
    title: 'New build · Benchtide',
    loadComponent: () => import('./builds/build-editor').then((m) => m.BuildEditor),
  },
  {
    path: 'builds/:buildId',
    title: 'Build · Benchtide',
    loadComponent: () => import('./builds/build-page').then((m) => m.BuildPage),
  },
  {
    path: 'builds/:buildId/edit',
    title: 'Edit build · Benchtide',
    loadComponent: () => import('./builds/build-editor').then((m) => m.BuildEditor),
  },
  {
    path: 'add-photo',
    title: 'Add a photo · Benchtide',
    loadComponent: () => import('./builds/photo-quick-add').then((m) => m.PhotoQuickAdd),
  },
  {
    path: 'shelf',
    title: 'Shelf · Benchtide',
    loadComponent: () => import('./shelf/shelf-page').then((m) => m.ShelfPage),
  },
  {
    path: 'workshop',
    title: 'Workshop · Benchtide',
    canActivate: [signedInGuard],
    loadComponent: () => import('./workshop/workshop-page').then((m) => m.WorkshopPage),
  },
  {
    path: 'log-pour',
    title: 'Log a pour · Benchtide',
    loadComponent: () => import('./pours/log-pour').then((m) => m.LogPour),
  },
  {
    path: 'costs',
    title: 'Costs · Benchtide',
    loadComponent: () => import('./costs/costs-page').then((m) => m.CostsPage),
  },
  {
    path: 'more',
    title: 'More · Benchtide',
    loadComponent: () => import('./more/more-page').then((m) => m.MorePage),
  },
  {
    path: 'device',
    title: 'This device · Benchtide',
    loadComponent: () => import('./device/device-page').then((m) => m.DevicePage),
  },
  {
    path: 'invitations/:token',
    title: 'Invitation · Benchtide',
    loadComponent: () => import('./workshop/invitation-accept').then((m) => m.InvitationAccept),
  },
  {
    path: 'account',
    title: 'Account · Benchtide',
    canActivate: [signedInGuard],
    loadComponent: () => import('./account/account-page').then((m) => m.AccountPage),
  },
  {
    path: 'sign-in',
    title: 'Sign in · Benchtide',
    loadComponent: () => import('./account/sign-in').then((m) => m.SignIn),
  },
  {
    path: 'sign-up',
    title: 'Create an account · Benchtide',
    loadComponent: () => import('./account/sign-up').then((m) => m.SignUp),
  },
  {
    path: 'verify',
    title: 'Confirm your e-mail · Benchtide',
    loadComponent: () => import('./account/verify-email').then((m) => m.VerifyEmail),
  },
  {
    path: 'forgot-password',
    title: 'Forgot your password · Benchtide',
    loadComponent: () => import('./account/forgot-password').then((m) => m.ForgotPassword),
  },
  {
    path: 'reset-password',
    title: 'New password · Benchtide',
    loadComponent: () => import('./account/reset-password').then((m) => m.ResetPassword),
  },
  { path: '**', redirectTo: '' },
];
