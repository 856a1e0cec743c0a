import { Routes } from '@angular/router';
import { authGuard } from './core/auth/auth-guard';
import { roleGuard } from './core/auth/role-guard';
import { Shell } from './core/shell/shell';

export const routes: Routes = [
  {
    path: 'sign-in',
    title: 'Sign in · Quietbridge',
    loadComponent: () => import('./sign-in/sign-in').then((m) => m.SignIn),
  },
  {
    path: 'sign-up',
    title: 'Create your reviewer account · Quietbridge',
    loadComponent: () => import('./sign-up/sign-up').then((m) => m.SignUp),
  },
  {
    path: '',
    component: Shell,
    children: [
      { path: '', pathMatch: 'full', redirectTo: 'designs' },
      {
        path: 'designs',
        title: 'Designs · Quietbridge',
        canActivate: [authGuard],
        loadComponent: () => import('./designs/designs').then((m) => m.Designs),
      },
      {
        path: 'designs/:id',
        title: 'Design workbench · Quietbridge',
        canActivate: [authGuard],
        loadComponent: () => import('./workbench/workbench').then((m) => m.Workbench),
      },
      {
        path: 'designs/:id/compare',
        title: 'Compare versions · Quietbridge',
        canActivate: [authGuard],
        loadComponent: () => import('./compare/compare-page').then((m) => m.ComparePage),
      },
      {
        path: 'designs/:id/calibration',
        title: 'Calibration · Quietbridge',
        canActivate: [authGuard],
        loadComponent: () => import('./calibration/calibration-page').then((m) => m.CalibrationPage),
      },
      {
        path: 'calibration',
        title: 'Calibration · Quietbridge',
        canActivate: [authGuard],
        loadComponent: () => import('./calibration/calibration-page').then((m) => m.CalibrationPage),
      },
      {
        path: 'reviews',
        title: 'Reviews · Quietbridge',
        canActivate: [authGuard],
        loadComponent: () => import('./reviews/reviews').then((m) => m.Reviews),
      },
      {
        path: 'reviews/:id',
        title: 'Review · Quietbridge',
        canActivate: [authGuard],
        loadComponent: () => import('./reviews/review-page').then((m) => m.ReviewPage),
      },
      {
        path: 'mailbox',
        title: 'Mailbox · Quietbridge',
        canActivate: [authGuard, roleGuard('admin')],
        loadComponent: () => import('./mailbox/mailbox').then((m) => m.Mailbox),
      },
      {
        path: 'accounts',
        title: 'Accounts · Quietbridge',
        canActivate: [authGuard, roleGuard('admin')],
        loadComponent: () => import('./accounts/accounts').then((m) => m.Accounts),
      },
      {
        path: 'about',
        title: 'About · Quietbridge',
        loadComponent: () => import('./about/about').then((m) => m.About),
      },
      {
        path: '**',
        title: 'Page not found · Quietbridge',
        loadComponent: () => import('./not-found/not-found').then((m) => m.NotFound),
      },
    ],
  },
];
