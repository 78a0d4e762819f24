// Assembles the app: Pinia, Quasar, router and the session guard. Shared by main.ts and the tests.
import { createApp, type App } from 'vue';
import { createPinia, type Pinia } from 'pinia';
import type { Router, RouterHistory } from 'vue-router';
import AppRoot from '../App.vue';
import { buildRouter } from '../router';
import { installQuasar } from './quasar';
import { installSessionGuard } from './session';

/** The assembled application parts. */
export interface VarsmithApp {
  app: App;
  router: Router;
  pinia: Pinia;
}

/**
 * Builds the application without mounting it.
 * @param history - router history (web history in the browser, memory history in tests).
 * @returns app, router and pinia.
 */
export function buildApp(history?: RouterHistory): VarsmithApp {
  const app = createApp(AppRoot);
  const pinia = createPinia();
  app.use(pinia);
  installQuasar(app);
  const router = buildRouter(history);
  app.use(router);
  installSessionGuard(router);
  return { app, router, pinia };
}
