// Who is signed in. The token lives in sessionStorage so a reload keeps the session of this tab.
import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import { fetchMe, login } from '../api/auth';
import { setApiToken } from '../api/client';
import type { Role, SessionUser } from '../api/types';

const TOKEN_KEY = 'varsmith.session';

function storage(): Storage | null {
  try {
    return typeof window !== 'undefined' ? window.sessionStorage : null;
  } catch {
    return null;
  }
}

/** The session: token, account and role checks. */
export const useSessionStore = defineStore('session', () => {
  /** Bearer token of the session, null when signed out. */
  const token = ref<string | null>(null);
  /** The signed-in account, null when signed out. */
  const user = ref<SessionUser | null>(null);
  /** Whether the stored token has been checked with the server since the page loaded. */
  const restored = ref(false);

  const signedIn = computed(() => token.value !== null && user.value !== null);
  const role = computed<Role | null>(() => user.value?.role ?? null);

  function adopt(newToken: string | null, newUser: SessionUser | null): void {
    token.value = newToken;
    user.value = newUser;
    setApiToken(newToken);
    const store = storage();
    if (store) {
      if (newToken) store.setItem(TOKEN_KEY, newToken);
      else store.removeItem(TOKEN_KEY);
    }
  }

  /** Signs in; throws the ApiError (401 bad credentials, 429 too many attempts). */
  async function signIn(email: string, password: string): Promise<SessionUser> {
    const answer = await login(email.trim(), password);
    adopt(answer.token, answer.user);
    restored.value = true;
    return answer.user;
  }

  /** Ends the session locally (tokens are stateless JWTs). */
  function signOut(): void {
    adopt(null, null);
  }

  /** Re-reads a stored token once per page load; a rejected token signs out. */
  async function restore(): Promise<void> {
    if (restored.value) return;
    restored.value = true;
    const saved = storage()?.getItem(TOKEN_KEY) ?? null;
    if (!saved) return;
    setApiToken(saved);
    try {
      adopt(saved, await fetchMe());
    } catch {
      adopt(null, null);
    }
  }

  /** Whether the signed-in role is one of `roles`. */
  function hasRole(roles: readonly Role[]): boolean {
    return role.value !== null && roles.includes(role.value);
  }

  return { token, user, restored, signedIn, role, signIn, signOut, restore, hasRole };
});
