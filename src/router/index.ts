// Router instance, the sign-in and role guard, and the typed `routerPush` helper.
import { createRouter, createWebHistory, type Router, type RouterHistory } from 'vue-router';
import { useSessionStore } from '../stores/session';
import { homeRouteFor, routes, type RouteName, type RouteParamsByName } from './routes';

export { routes, homeRouteFor, type RouteName, type RouteParamsByName } from './routes';

let activeRouter: Router | null = null;

/**
 * Creates the router with its guards (needs an active Pinia).
 * @param history - browser history in the app, memory history in tests.
 * @returns the router.
 */
export function buildRouter(history: RouterHistory = createWebHistory()): Router {
  const router = createRouter({ history, routes, scrollBehavior: () => ({ top: 0 }) });
  router.beforeEach(async (to) => {
    const session = useSessionStore();
    await session.restore();
    const roles = to.matched.reduce<readonly string[] | undefined>((acc, record) => record.meta.roles ?? acc, undefined);
    if (to.name === 'sign-in' && session.signedIn && session.role) return { name: homeRouteFor(session.role) };
    if (to.name === 'home' && session.signedIn && session.role) return { name: homeRouteFor(session.role) };
    if (!roles) return true;
    if (!session.signedIn || !session.role) {
      return { name: 'sign-in', query: to.fullPath !== '/' ? { next: to.fullPath } : {} };
    }
    if (!roles.includes(session.role)) return { name: homeRouteFor(session.role), query: { refused: String(to.name ?? to.path) } };
    return true;
  });
  router.afterEach((to) => {
    if (typeof document !== 'undefined') document.title = to.meta.title ? `${to.meta.title} · Varsmith` : 'Varsmith';
  });
  activeRouter = router;
  return router;
}

type ParamsArg<N extends RouteName> = N extends keyof RouteParamsByName ? [params: RouteParamsByName[N]] : [params?: undefined];

/**
 * Navigates to a named route with its typed parameters.
 * @param name - route name.
 * @param args - the route's parameters when it has any.
 * @returns the navigation promise.
 */
export function routerPush<N extends RouteName>(name: N, ...args: ParamsArg<N>): ReturnType<Router['push']> {
  if (!activeRouter) throw new Error('routerPush: the router is not built yet');
  const params = args[0] as Record<string, string | string[]> | undefined;
  return activeRouter.push(params ? { name, params } : { name });
}

/** The router built last (for code outside components, e.g. the 401 handler). */
export function currentRouter(): Router | null {
  return activeRouter;
}
