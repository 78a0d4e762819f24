// Read-only tokens for benches and CI: list, create (secret shown once), revoke.
import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { AccessToken, CreatedAccessToken } from '../../shared/api/releases';
import { createToken, listTokens, revokeToken } from '../api/tokens';

/** The signed-in user's bench tokens. */
export const useTokensStore = defineStore('tokens', () => {
  /** Tokens as listed (never with secrets), newest first. */
  const items = ref<AccessToken[]>([]);
  /** The token created last, with its secret; cleared once the user has taken it. */
  const justCreated = ref<CreatedAccessToken | null>(null);

  /** Reloads the tokens. */
  async function load(): Promise<AccessToken[]> {
    const rows = await listTokens();
    items.value = [...rows].sort((x, y) => y.createdAt.localeCompare(x.createdAt));
    return items.value;
  }

  /** Creates a token and keeps its secret in `justCreated` until `forgetSecret`. */
  async function create(name: string): Promise<CreatedAccessToken> {
    const created = await createToken(name);
    justCreated.value = created;
    const { secret: _secret, ...listed } = created;
    items.value = [listed, ...items.value.filter((t) => t.id !== created.id)];
    return created;
  }

  /** Drops the shown-once secret from memory. */
  function forgetSecret(): void {
    justCreated.value = null;
  }

  /** Revokes a token and reloads the list so the revocation time shows. */
  async function revoke(id: number): Promise<void> {
    await revokeToken(id);
    if (justCreated.value?.id === id) justCreated.value = null;
    await load();
  }

  return { items, justCreated, load, create, forgetSecret, revoke };
});
