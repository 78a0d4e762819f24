// Navigation entries derived from the route table: only what the role may open.
import type { RouteRecordRaw } from 'vue-router';
import type { Role } from '../api/types';
import { routes, type RouteName } from '../router/routes';

/** One navigation entry. */
export interface NavEntry {
  name: RouteName;
  label: string;
  icon: string;
}

function flatten(records: readonly RouteRecordRaw[]): RouteRecordRaw[] {
  return records.flatMap((r) => [r, ...flatten(r.children ?? [])]);
}

/**
 * The navigation for a role, in route-table order.
 * @param role - the signed-in role.
 * @param table - the route table (the app's by default).
 * @returns the entries the role may use.
 */
export function navigationFor(role: Role, table: readonly RouteRecordRaw[] = routes): NavEntry[] {
  return flatten(table)
    .filter((r) => r.meta?.navLabel && typeof r.name === 'string' && (r.meta.roles ?? []).includes(role))
    .map((r) => ({ name: r.name as RouteName, label: r.meta?.navLabel as string, icon: r.meta?.navIcon ?? 'chevron_right' }));
}
