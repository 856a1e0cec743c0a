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
