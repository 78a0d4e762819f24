// Wires the API client's 401 handler to the session and the router: any 401 ends the session
// and returns to sign-in, keeping where the user was.
import type { Router } from 'vue-router';
import { setUnauthorizedHandler } from '../api/client';
import { useSessionStore } from '../stores/session';

/**
 * Connects the 401 handler (needs an active Pinia).
 * @param router - the app router.
 */
export function installSessionGuard(router: Router): void {
  setUnauthorizedHandler(() => {
    const session = useSessionStore();
    const wasSignedIn = session.signedIn;
    session.signOut();
    const current = router.currentRoute.value;
    if (current.name !== 'sign-in') {
      void router.replace({ name: 'sign-in', query: { next: current.fullPath, ...(wasSignedIn ? { expired: '1' } : {}) } });
    }
  });
}
