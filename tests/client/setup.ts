// Client test setup: the network is mocked at the HTTP level with msw (never the src/api module).
import { afterAll, afterEach, beforeAll } from 'vitest';
import { setupServer } from 'msw/node';
import { setApiToken, setUnauthorizedHandler } from '../../src/api/client';

/** The msw server every client test registers its handlers on. */
export const server = setupServer();

beforeAll(() => server.listen({ onUnhandledRequest: 'error' }));
afterEach(() => {
  server.resetHandlers();
  setApiToken(null);
  setUnauthorizedHandler(null);
  window.sessionStorage.clear();
  document.body.innerHTML = '';
});
afterAll(() => server.close());
