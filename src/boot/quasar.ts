// Quasar with the plugins the app uses; fonts and icons ship from @quasar/extras (nothing remote).
import type { App } from 'vue';
import { Dialog, Notify, Quasar } from 'quasar';
import iconSet from 'quasar/icon-set/material-icons';

/**
 * Installs Quasar on the app.
 * @param app - the Vue app.
 */
export function installQuasar(app: App): void {
  app.use(Quasar, {
    plugins: { Dialog, Notify },
    iconSet,
    config: {
      brand: { primary: '#1e2a3a', secondary: '#c27a4a', accent: '#e8b84a' },
      notify: { position: 'top-right', timeout: 4000 },
    },
  });
}
