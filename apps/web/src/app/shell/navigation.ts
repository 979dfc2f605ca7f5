import type { CanActivateFn } from '@angular/router';
import { ROLES, type Role } from '@keelson/contracts';
import { roleGuard } from '../auth/auth-guard';

/** One destination of the main navigation. */
export interface NavigationEntry {
  /** What the sidenav shows (and the link's accessible name). */
  readonly label: string;
  /** A Material Symbols ligature. */
  readonly icon: string;
  /** The route path, without a leading slash. */
  readonly path: string;
  /** The roles that may open it; the sidenav and the route guard both read this. */
  readonly roles: readonly Role[];
  /** Other pages that belong to this entry, as URL paths without the leading slash. */
  readonly owns?: RegExp;
}

/**
 * The main navigation, in display order: the single list both the sidenav and the route guards
 * read, so what a role sees and what it may open cannot drift apart. A new screen adds one line
 * here and one lazy route in app.routes.ts that uses `navigationGuard(path)`.
 */
export const NAVIGATION = [
  { label: 'Home', icon: 'home', path: 'home', roles: ROLES },
  { label: 'Import', icon: 'upload_file', path: 'imports', roles: ['buyer', 'admin'] },
  { label: 'Network', icon: 'account_tree', path: 'network', roles: ROLES },
  // A run's supplier risk page lives under /risk but is part of reviewing a run.
  { label: 'Analysis runs', icon: 'insights', path: 'runs', roles: ROLES,
    owns: /^risk\/\d+\/suppliers\// },
  { label: 'Scenarios', icon: 'thunderstorm', path: 'runs/scenarios', roles: ROLES },
  { label: 'Network picture', icon: 'hub', path: 'risk', roles: ROLES },
  // A plan's page (/plans/:id) is part of its register entry.
  { label: 'Risk register', icon: 'fact_check', path: 'register', roles: ROLES,
    owns: /^plans\// },
  { label: 'Quarterly re-scoring', icon: 'event_repeat', path: 'rescoring', roles: ROLES },
  { label: 'Approvals', icon: 'approval', path: 'approvals',
    roles: ['plant_manager', 'risk_manager', 'admin'] },
  { label: 'My tasks', icon: 'task_alt', path: 'tasks', roles: ROLES },
  { label: 'E-mail settings', icon: 'mark_email_read', path: 'account', roles: ROLES },
  { label: 'Users', icon: 'manage_accounts', path: 'admin/users', roles: ['admin'] },
  { label: 'Sent mail', icon: 'outgoing_mail', path: 'admin/mail', roles: ['admin'] },
  { label: 'Countries', icon: 'public', path: 'admin/countries', roles: ['admin'] },
  { label: 'Scoring', icon: 'tune', path: 'admin/scoring', roles: ['admin'] },
  { label: 'Audit trail', icon: 'history', path: 'admin/audit', roles: ['admin'] },
] as const satisfies readonly NavigationEntry[];

/** A path that has an entry in {@link NAVIGATION}. */
export type NavigationPath = (typeof NAVIGATION)[number]['path'];

/** The entries a role may use, in display order. */
export function navigationFor(role: Role | null): readonly NavigationEntry[] {
  if (role === null) {
    return [];
  }
  return NAVIGATION.filter((entry: NavigationEntry) => entry.roles.includes(role));
}

/** The roles allowed on a navigation path; throws when the path has no entry. */
export function rolesFor(path: NavigationPath): readonly Role[] {
  const entry = NAVIGATION.find((candidate) => candidate.path === path);
  if (!entry) {
    throw new Error(`navigation: no entry for path "${path}" in NAVIGATION (shell/navigation.ts).`);
  }
  return entry.roles;
}

/** The route guard for a navigation path: lets through exactly the roles of its entry. */
export function navigationGuard(path: NavigationPath): CanActivateFn {
  return roleGuard(...rolesFor(path));
}

/**
 * The path of the entry a URL belongs to: the longest entry path that the URL's path equals or
 * lies under (`/runs/scenarios` is Scenarios, `/runs/7` is Analysis runs); null for none.
 */
export function activeNavigationPath(
  entries: readonly NavigationEntry[],
  url: string,
): string | null {
  const path = url.split(/[?#]/)[0]!.replace(/^\/+/, '');
  const owner = entries.find((entry) => entry.owns?.test(path));
  if (owner) return owner.path;
  let best: string | null = null;
  for (const entry of entries) {
    const isUnder = path === entry.path || path.startsWith(`${entry.path}/`);
    if (isUnder && (best === null || entry.path.length > best.length)) best = entry.path;
  }
  return best;
}
