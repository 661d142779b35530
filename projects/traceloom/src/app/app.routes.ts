import { PERMISSIONS } from '@traceloom/shared/api';
import { Routes } from '@angular/router';
import { roleGuard, signedInGuard, signedOutGuard } from './core/guards';

export const routes: Routes = [
  {
    path: 'sign-in',
    title: 'Sign in · Traceloom',
    canActivate: [signedOutGuard],
    loadComponent: () => import('./auth/sign-in').then((m) => m.SignIn),
  },
  {
    path: 'public/:hash',
    title: 'Dataset · Traceloom',
    loadComponent: () => import('./public/public-dataset').then((m) => m.PublicDatasetPage),
  },
  {
    path: 'welcome/:key',
    title: 'Welcome · Traceloom',
    loadComponent: () => import('./public/welcome').then((m) => m.Welcome),
  },
  {
    path: '',
    canActivate: [signedInGuard],
    loadComponent: () => import('./shell/shell').then((m) => m.Shell),
    children: [
      { path: '', pathMatch: 'full', redirectTo: 'studies' },
      {
        path: 'studies',
        title: 'Studies · Traceloom',
        loadComponent: () => import('./studies/study-list').then((m) => m.StudyList),
      },
      {
        path: 'studies/:id',
        title: 'Study · Traceloom',
        loadComponent: () => import('./studies/study-page').then((m) => m.StudyPage),
      },
      {
        path: 'studies/:studyId/gases/new',
        title: 'New gas · Traceloom',
        loadComponent: () => import('./gases/gas-editor').then((m) => m.GasEditor),
      },
      {
        path: 'gases/:gasId',
        title: 'Gas · Traceloom',
        loadComponent: () => import('./gases/gas-editor').then((m) => m.GasEditor),
      },
      {
        path: 'runs/:runId',
        title: 'Run · Traceloom',
        loadComponent: () => import('./runs/run-page').then((m) => m.RunPage),
      },
      {
        path: 'references/:referenceId',
        title: 'Reference table · Traceloom',
        loadComponent: () => import('./references/reference-page').then((m) => m.ReferencePage),
      },
      {
        path: 'datasets',
        title: 'Datasets · Traceloom',
        loadComponent: () => import('./datasets/dataset-list').then((m) => m.DatasetList),
      },
      {
        path: 'datasets/:datasetId',
        title: 'Dataset · Traceloom',
        loadComponent: () => import('./datasets/dataset-page').then((m) => m.DatasetPage),
      },
      {
        path: 'reviews',
        title: 'Review requests · Traceloom',
        loadComponent: () => import('./review/review-inbox').then((m) => m.ReviewInbox),
      },
      {
        path: 'audit',
        title: 'Audit log · Traceloom',
        canActivate: [roleGuard(...PERMISSIONS.readAudit)],
        loadComponent: () => import('./audit/audit-log').then((m) => m.AuditLog),
      },
      {
        path: 'admin/mailbox',
        title: 'Mailbox · Traceloom',
        canActivate: [roleGuard(...PERMISSIONS.administer)],
        loadComponent: () => import('./mailbox/mailbox').then((m) => m.Mailbox),
      },
      {
        path: 'help',
        title: 'Guide · Traceloom',
        loadComponent: () => import('./help/help-page').then((m) => m.HelpPageView),
      },
      {
        path: 'help/:page',
        title: 'Guide · Traceloom',
        loadComponent: () => import('./help/help-page').then((m) => m.HelpPageView),
      },
      {
        path: 'admin/users',
        title: 'Users · Traceloom',
        canActivate: [roleGuard(...PERMISSIONS.administer)],
        loadComponent: () => import('./admin/user-list').then((m) => m.UserList),
      },
    ],
  },
  { path: '**', redirectTo: '' },
];
