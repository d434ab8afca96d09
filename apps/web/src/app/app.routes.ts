import type { Routes } from '@angular/router';
import { roleGuard } from './core/role-guard';

const PEOPLE = ['admin', 'engineer', 'reviewer', 'viewer'] as const;

export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'projects' },
  {
    path: 'sign-in',
    title: 'Sign in · Scarpline',
    loadComponent: () => import('./sign-in/sign-in').then((m) => m.SignIn),
  },
  {
    path: 'forgot-password',
    title: 'Forgot your password · Scarpline',
    loadComponent: () => import('./account/forgot-password').then((m) => m.ForgotPassword),
  },
  {
    path: 'reset-password',
    title: 'Set a new password · Scarpline',
    loadComponent: () => import('./account/reset-password').then((m) => m.ResetPassword),
  },
  {
    path: 'account/password',
    title: 'Change password · Scarpline',
    canActivate: [roleGuard(...PEOPLE)],
    loadComponent: () => import('./account/change-password').then((m) => m.ChangePassword),
  },
  {
    path: 'not-allowed',
    title: 'Not allowed · Scarpline',
    loadComponent: () => import('./shell/not-allowed').then((m) => m.NotAllowed),
  },
  {
    path: 'projects',
    title: 'Projects · Scarpline',
    canActivate: [roleGuard(...PEOPLE)],
    loadComponent: () => import('./projects/project-list').then((m) => m.ProjectList),
  },
  {
    path: 'projects/:id',
    title: 'Project · Scarpline',
    canActivate: [roleGuard(...PEOPLE)],
    loadComponent: () => import('./projects/project-detail').then((m) => m.ProjectDetail),
  },
  {
    path: 'projects/:id/submit',
    title: 'Submit a batch · Scarpline',
    canActivate: [roleGuard('admin', 'engineer')],
    loadComponent: () => import('./batches/batch-submit').then((m) => m.BatchSubmit),
  },
  {
    path: 'batches/:id',
    title: 'Batch · Scarpline',
    canActivate: [roleGuard(...PEOPLE)],
    loadComponent: () => import('./batches/batch-detail').then((m) => m.BatchDetail),
  },
  {
    path: 'sections/:id',
    title: 'Section · Scarpline',
    canActivate: [roleGuard(...PEOPLE)],
    loadComponent: () => import('./sections/section-detail').then((m) => m.SectionDetail),
  },
  {
    path: 'reviews',
    title: 'To review · Scarpline',
    canActivate: [roleGuard('admin', 'reviewer')],
    loadComponent: () => import('./reviews/review-queue').then((m) => m.ReviewQueue),
  },
  {
    path: 'admin/users',
    title: 'Users · Scarpline',
    canActivate: [roleGuard('admin')],
    loadComponent: () => import('./admin/user-admin').then((m) => m.UserAdmin),
  },
  {
    path: 'admin/tokens',
    title: 'API tokens · Scarpline',
    canActivate: [roleGuard('admin')],
    loadComponent: () => import('./admin/token-admin').then((m) => m.TokenAdmin),
  },
  {
    path: '**',
    title: 'Not found · Scarpline',
    loadComponent: () => import('./shell/not-found').then((m) => m.NotFound),
  },
];
