import type { Routes } from '@angular/router';
import { signedInGuard, signedOutGuard } from './auth/auth-guard';
import { navigationGuard } from './shell/navigation';

/**
 * Top-level routes. Pages inside the signed-in shell are lazy and guarded by their entry in
 * shell/navigation.ts (`navigationGuard(path)`), so the roles live in one place.
 */
export const routes: Routes = [
  {
    path: 'sign-in',
    title: 'Sign in · Keelson',
    canActivate: [signedOutGuard],
    loadComponent: () => import('./auth/sign-in-page').then((m) => m.SignInPage),
  },
  {
    path: 'set-password',
    title: 'Choose your password · Keelson',
    loadComponent: () => import('./auth/set-password-page').then((m) => m.SetPasswordPage),
  },
  {
    path: '',
    canActivate: [signedInGuard],
    loadComponent: () => import('./shell/shell').then((m) => m.Shell),
    children: [
      { path: '', pathMatch: 'full', redirectTo: 'home' },
      {
        path: 'home',
        title: 'Home · Keelson',
        canActivate: [navigationGuard('home')],
        loadComponent: () => import('./home/home-page').then((m) => m.HomePage),
      },
      {
        path: 'imports',
        canActivate: [navigationGuard('imports')],
        loadChildren: () => import('./imports/imports.routes').then((m) => m.importsRoutes),
      },
      {
        path: 'network',
        canActivate: [navigationGuard('network')],
        loadChildren: () => import('./network/network.routes').then((m) => m.networkRoutes),
      },
      {
        path: 'runs',
        canActivate: [navigationGuard('runs')],
        loadChildren: () => import('./runs/runs.routes').then((m) => m.runsRoutes),
      },
      {
        path: 'risk',
        canActivate: [navigationGuard('risk')],
        loadChildren: () => import('./risk/risk.routes').then((m) => m.riskRoutes),
      },
      {
        path: 'register',
        canActivate: [navigationGuard('register')],
        loadChildren: () => import('./register/register.routes').then((m) => m.registerRoutes),
      },
      {
        path: 'rescoring',
        canActivate: [navigationGuard('rescoring')],
        loadChildren: () => import('./rescoring/rescoring.routes').then((m) => m.rescoringRoutes),
      },
      {
        path: 'plans',
        canActivate: [navigationGuard('register')],
        loadChildren: () => import('./plans/plans.routes').then((m) => m.plansRoutes),
      },
      {
        path: 'approvals',
        canActivate: [navigationGuard('approvals')],
        loadChildren: () => import('./plans/approvals.routes').then((m) => m.approvalsRoutes),
      },
      {
        path: 'tasks',
        canActivate: [navigationGuard('tasks')],
        loadChildren: () => import('./plans/tasks.routes').then((m) => m.tasksRoutes),
      },
      {
        path: 'account',
        canActivate: [navigationGuard('account')],
        loadChildren: () => import('./account/account.routes').then((m) => m.accountRoutes),
      },
      {
        path: 'admin',
        loadChildren: () => import('./admin/admin.routes').then((m) => m.adminRoutes),
      },
      {
        path: 'forbidden',
        title: 'Not open to your role · Keelson',
        loadComponent: () => import('./errors/forbidden-page').then((m) => m.ForbiddenPage),
      },
    ],
  },
  {
    path: '**',
    title: 'Page not found · Keelson',
    loadComponent: () => import('./errors/not-found-page').then((m) => m.NotFoundPage),
  },
];
