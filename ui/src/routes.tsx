import {
  IconDatabase,
  IconDownload,
  IconLayoutDashboard,
  IconMathFunction,
  IconPlus,
  IconShieldLock,
  IconStack2,
  IconTarget,
  type Icon,
} from '@tabler/icons-react';
import type { ComponentType } from 'react';
import { CREATOR_ROLES } from '@driftgrid/domain';
import type { Role } from './auth/session.js';

/**
 * The route table: one row per page. router.tsx turns it into React Router routes (lazy-loaded,
 * behind the sign-in guard and role gate); the left rail shows rows that have `nav`.
 * To add a page: create `pages/<Name>.page.tsx` with a default export and add a row here.
 */
export interface PageRoute {
  path: string;
  /** Browser tab and heading. */
  title: string;
  load: () => Promise<{ default: ComponentType }>;
  /** Who may open it; omitted = every signed-in role. The server checks again. */
  roles?: readonly Role[];
  nav?: {
    label: string;
    icon: Icon;
    /** Other path prefixes that highlight this item (a sweep page highlights Catalogue). */
    alsoActiveFor?: readonly string[];
  };
}

export const pageRoutes: readonly PageRoute[] = [
  {
    path: '/',
    title: 'Dashboard',
    load: () => import('./pages/Dashboard.page.js'),
    nav: { label: 'Dashboard', icon: IconLayoutDashboard },
  },
  {
    path: '/sweeps/new',
    title: 'New sweep',
    roles: CREATOR_ROLES,
    load: () => import('./pages/NewSweep.page.js'),
    nav: { label: 'New sweep', icon: IconPlus },
  },
  {
    path: '/catalogue',
    title: 'Catalogue',
    load: () => import('./pages/Catalogue.page.js'),
    nav: { label: 'Catalogue', icon: IconStack2, alsoActiveFor: ['/sweeps/'] },
  },
  { path: '/sweeps/:id', title: 'Sweep', load: () => import('./pages/Sweep.page.js') },
  {
    path: '/datasets',
    title: 'Datasets',
    roles: CREATOR_ROLES,
    load: () => import('./pages/Datasets.page.js'),
    nav: { label: 'Datasets', icon: IconDatabase, alsoActiveFor: ['/datasets/'] },
  },
  { path: '/datasets/:id', title: 'Dataset', load: () => import('./pages/Dataset.page.js') },
  {
    path: '/downloads',
    title: 'Downloads',
    load: () => import('./pages/Downloads.page.js'),
    nav: { label: 'Downloads', icon: IconDownload },
  },
  {
    path: '/fits',
    title: 'Fits',
    load: () => import('./pages/Fits.page.js'),
    nav: { label: 'Fits', icon: IconMathFunction, alsoActiveFor: ['/fits/'] },
  },
  { path: '/fits/compare', title: 'Compare fits', load: () => import('./pages/FitCompare.page.js') },
  { path: '/fits/:id', title: 'Fit', load: () => import('./pages/Fit.page.js') },
  {
    path: '/single-point',
    title: 'Single point',
    load: () => import('./pages/SinglePoint.page.js'),
    nav: { label: 'Single point', icon: IconTarget },
  },
  {
    path: '/admin',
    title: 'Admin',
    roles: ['admin'],
    load: () => import('./pages/Admin.page.js'),
    nav: { label: 'Admin', icon: IconShieldLock },
  },
  { path: '/account/tokens', title: 'API tokens', load: () => import('./pages/Tokens.page.js') },
  { path: '/account/password', title: 'Password', load: () => import('./pages/Password.page.js') },
];

/** Pages outside the shell, open without signing in. */
export const publicRoutes: readonly PageRoute[] = [
  { path: '/sign-in', title: 'Sign in', load: () => import('./pages/SignIn.page.js') },
  { path: '/accept-invite', title: 'Accept invitation', load: () => import('./pages/AcceptInvite.page.js') },
  { path: '/reset-password', title: 'Reset password', load: () => import('./pages/ResetPassword.page.js') },
];

export const navRoutes = pageRoutes.filter((r) => r.nav);

/** Where the account menu links. */
export const accountPaths = { tokens: '/account/tokens', password: '/account/password' } as const;
