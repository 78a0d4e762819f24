// Setup stores of the team flow against HTTP mocked with msw: review queue and verdicts,
// releases, bench tokens (secret shown once), admin accounts, audit filters and mail.
import { beforeEach, describe, expect, it } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { http, HttpResponse } from 'msw';
import type { Release } from '../../../shared/api/releases';
import { pullCommand, shellQuote } from '../../../src/api/releases';
import { useAdminStore } from '../../../src/stores/admin';
import { useReleasesStore } from '../../../src/stores/releases';
import { useReviewStore } from '../../../src/stores/review';
import { useTokensStore } from '../../../src/stores/tokens';
import { buildDesignDetail, buildRevisionSummary } from '../fixtures';
import { TEST_USERS } from '../session';
import { server } from '../setup';

const person = { id: 1, name: 'Ena Engineer', email: 'engineer@varsmith.test' };

function buildRelease(overrides: Partial<Release> = {}): Release {
  return {
    id: 3, designId: 7, designName: 'Bay 4 rig', revisionId: 10, revisionNumber: 1, version: '1.0.0', fileName: 'bay-4-rig-1.0.0.zip',
    sizeBytes: 20480, sha256: 'ab'.repeat(32), releasedBy: person, createdAt: '2026-11-30T12:00:00.000Z', withdrawnAt: null, withdrawnReason: null, withdrawnBy: null,
    ...overrides,
  };
}

beforeEach(() => {
  setActivePinia(createPinia());
});

describe('review store', () => {
  it('queues only latest revisions in review, oldest first', async () => {
    server.use(http.get('*/api/designs', () => HttpResponse.json([
      buildDesignDetail({ id: 1, name: 'A', latestRevision: buildRevisionSummary({ id: 11, designId: 1, status: 'in-review', createdAt: '2026-11-30T10:00:00Z' }) }),
      buildDesignDetail({ id: 2, name: 'B', latestRevision: buildRevisionSummary({ id: 12, designId: 2, status: 'approved' }) }),
      buildDesignDetail({ id: 3, name: 'C', latestRevision: null }),
      buildDesignDetail({ id: 4, name: 'D', latestRevision: buildRevisionSummary({ id: 14, designId: 4, status: 'in-review', createdAt: '2026-11-29T10:00:00Z' }) }),
    ])));
    const store = useReviewStore();
    const queue = await store.loadQueue();
    expect(queue.map((e) => e.designName)).toEqual(['D', 'A']);
    expect(queue.map((e) => e.revision.id)).toEqual([14, 11]);
  });

  it('drops a decided revision from the queue and passes a 403 on through', async () => {
    server.use(
      http.get('*/api/designs', () => HttpResponse.json([buildDesignDetail({ id: 1, latestRevision: buildRevisionSummary({ id: 11, designId: 1 }) })])),
      http.post('*/api/revisions/11/reviews', () => HttpResponse.json({ id: 5, revisionId: 11, reviewer: TEST_USERS.reviewer, decision: 'changes', comment: 'Raise the margin', createdAt: '2026-12-01T09:00:00Z' }, { status: 201 })),
      http.post('*/api/revisions/12/reviews', () => HttpResponse.json({ error: { code: 'own-revision', message: 'You cannot review your own revision' } }, { status: 403 })),
    );
    const store = useReviewStore();
    await store.loadQueue();
    const review = await store.decide(11, { decision: 'changes', comment: 'Raise the margin' });
    expect(review.decision).toBe('changes');
    expect(store.queue).toHaveLength(0);
    await expect(store.decide(12, { decision: 'approve', comment: '' })).rejects.toMatchObject({ status: 403, message: 'You cannot review your own revision' });
  });

  it('sorts the history newest first', async () => {
    server.use(http.get('*/api/designs/7/revisions', () => HttpResponse.json({ revisions: [buildRevisionSummary({ id: 1, number: 1 }), buildRevisionSummary({ id: 3, number: 3 }), buildRevisionSummary({ id: 2, number: 2 })] })));
    const store = useReviewStore();
    expect((await store.loadHistory(7)).map((r) => r.number)).toEqual([3, 2, 1]);
  });

  it('reads one page of the history and the revision just older than it, with the total', async () => {
    let asked: URLSearchParams | null = null;
    server.use(http.get('*/api/designs/7/revisions', ({ request }) => {
      asked = new URL(request.url).searchParams;
      return HttpResponse.json([5, 4, 3].map((n) => buildRevisionSummary({ id: 100 + n, number: n })), { headers: { 'X-Total-Count': '9' } });
    }));
    const store = useReviewStore();
    expect((await store.loadHistory(7, { limit: 2, offset: 4 })).map((r) => r.number)).toEqual([5, 4]);
    expect(Object.fromEntries(asked!.entries())).toEqual({ limit: '3', offset: '4' });
    expect(store.historyOlder?.number).toBe(3);
    expect(store.historyTotal).toBe(9);
  });

  it('asks only for designs in review for the queue and keeps how many wait in all', async () => {
    let asked: URLSearchParams | null = null;
    server.use(http.get('*/api/designs', ({ request }) => {
      asked = new URL(request.url).searchParams;
      return HttpResponse.json([buildDesignDetail({ id: 1, latestRevision: buildRevisionSummary({ id: 11, designId: 1 }) })], { headers: { 'X-Total-Count': '240' } });
    }));
    const store = useReviewStore();
    await store.loadQueue();
    expect(asked!.get('status')).toBe('in-review');
    expect(asked!.get('limit')).toBe('200');
    expect(store.queueTotal).toBe(240);
  });
});

describe('releases store', () => {
  it('lists newest first and puts a new release on top', async () => {
    let posted: unknown = null;
    server.use(
      http.get('*/api/releases', () => HttpResponse.json([buildRelease({ id: 1, createdAt: '2026-11-01T00:00:00Z' }), buildRelease({ id: 2, version: '1.1.0', createdAt: '2026-11-20T00:00:00Z' })])),
      http.post('*/api/revisions/20/release', async ({ request }) => {
        posted = await request.json();
        return HttpResponse.json(buildRelease({ id: 9, version: '2.0.0', revisionId: 20, createdAt: '2026-12-01T00:00:00Z' }), { status: 201 });
      }),
    );
    const store = useReleasesStore();
    expect((await store.load()).map((r) => r.id)).toEqual([2, 1]);
    await store.release(20, '2.0.0');
    expect(posted).toEqual({ version: '2.0.0' });
    expect(store.items.map((r) => r.id)).toEqual([9, 2, 1]);
  });

  it('keeps the list unchanged when the server refuses a duplicate version (409)', async () => {
    server.use(
      http.get('*/api/releases', () => HttpResponse.json([buildRelease()])),
      http.post('*/api/revisions/20/release', () => HttpResponse.json({ error: { code: 'version-taken', message: 'version 1.0.0 is already released', fields: [{ path: 'version', message: 'must be unique per design' }] } }, { status: 409 })),
    );
    const store = useReleasesStore();
    await store.load();
    await expect(store.release(20, '1.0.0')).rejects.toMatchObject({ status: 409, fields: [{ path: 'version', message: 'must be unique per design' }] });
    expect(store.items).toHaveLength(1);
  });

  it('downloads the bundle bytes unchanged', async () => {
    const bytes = new Uint8Array([0x50, 0x4b, 0x03, 0x04, 1, 2, 3]);
    server.use(http.get('*/api/releases/3/bundle', () => new HttpResponse(bytes, { headers: { 'Content-Type': 'application/zip', 'Content-Disposition': 'attachment; filename="bay-4-rig-1.0.0.zip"', 'Content-Length': String(bytes.length) } })));
    const file = await useReleasesStore().download(3);
    expect(file.fileName).toBe('bay-4-rig-1.0.0.zip');
    expect([...new Uint8Array(await file.blob.arrayBuffer())]).toEqual([...bytes]);
  });

  it('takes the total from X-Total-Count, and without it counts what the page shows', async () => {
    server.use(http.get('*/api/releases', ({ request }) => {
      const withHeader = new URL(request.url).searchParams.get('q') === 'bay';
      return HttpResponse.json([buildRelease()], withHeader ? { headers: { 'X-Total-Count': '130' } } : {});
    }));
    const store = useReleasesStore();
    await store.load({ q: 'bay' });
    expect(store.total).toBe(130);
    await store.load({ limit: 25, offset: 50 });
    expect(store.total).toBe(51);
  });
});

describe('pull command', () => {
  it('has the CONTRACT section 4 form and quotes design names with spaces for a POSIX shell', () => {
    expect(pullCommand('https://varsmith.lab:8443', buildRelease())).toBe(
      "npx varsmith pull --server https://varsmith.lab:8443 --token <token> --design 'Bay 4 rig' --set-version 1.0.0 -o bay-4-rig-1.0.0.zip",
    );
    expect(shellQuote("Kit's rig")).toBe(`'Kit'\\''s rig'`);
    expect(shellQuote('sc-3')).toBe('sc-3');
  });
});

describe('tokens store', () => {
  it('keeps the secret only in justCreated, never in the list, and forgets it on request', async () => {
    server.use(
      http.get('*/api/tokens', () => HttpResponse.json([])),
      http.post('*/api/tokens', () => HttpResponse.json({ id: 4, name: 'HIL rack', owner: person, prefix: 'vst_ab12', createdAt: '2026-12-01T00:00:00Z', lastUsedAt: null, revokedAt: null, secret: 'vst_ab12_SECRET' }, { status: 201 })),
    );
    const store = useTokensStore();
    await store.load();
    await store.create('HIL rack');
    expect(store.justCreated?.secret).toBe('vst_ab12_SECRET');
    expect(JSON.stringify(store.items)).not.toContain('SECRET');
    store.forgetSecret();
    expect(store.justCreated).toBeNull();
  });

  it('reloads after revoking so the revocation time shows', async () => {
    let revoked = false;
    server.use(
      http.delete('*/api/tokens/4', () => { revoked = true; return new HttpResponse(null, { status: 204 }); }),
      http.get('*/api/tokens', () => HttpResponse.json([{ id: 4, name: 'HIL rack', owner: person, prefix: 'vst_ab12', createdAt: '2026-12-01T00:00:00Z', lastUsedAt: null, revokedAt: revoked ? '2026-12-01T01:00:00Z' : null }])),
    );
    const store = useTokensStore();
    await store.load();
    expect(store.items[0].revokedAt).toBeNull();
    await store.revoke(4);
    expect(store.items[0].revokedAt).toBe('2026-12-01T01:00:00Z');
  });
});

describe('admin store', () => {
  it('sends audit filters as query parameters and leaves empty ones out', async () => {
    let query: URLSearchParams | null = null;
    server.use(http.get('*/api/admin/audit', ({ request }) => {
      query = new URL(request.url).searchParams;
      return HttpResponse.json([]);
    }));
    await useAdminStore().loadAudit({ action: 'release.create', actorId: 4, since: '2026-11-01T00:00:00.000Z', until: undefined });
    expect(query).not.toBeNull();
    expect(Object.fromEntries(query!.entries())).toEqual({ action: 'release.create', actorId: '4', since: '2026-11-01T00:00:00.000Z', limit: '200', offset: '0' });
  });

  it('replaces a changed account and keeps the list sorted by name', async () => {
    const users = [
      { id: 2, email: 'z@varsmith.test', name: 'Zed', role: 'tester', disabled: false, createdAt: '2026-11-01T00:00:00Z' },
      { id: 1, email: 'a@varsmith.test', name: 'Ada', role: 'engineer', disabled: false, createdAt: '2026-11-01T00:00:00Z' },
    ];
    let patch: unknown = null;
    server.use(
      http.get('*/api/admin/users', () => HttpResponse.json(users)),
      http.patch('*/api/admin/users/2', async ({ request }) => {
        patch = await request.json();
        return HttpResponse.json({ ...users[0], role: 'reviewer' });
      }),
    );
    const store = useAdminStore();
    expect((await store.loadUsers()).map((u) => u.name)).toEqual(['Ada', 'Zed']);
    await store.updateUser(2, { role: 'reviewer' });
    expect(patch).toEqual({ role: 'reviewer' });
    expect(store.users.map((u) => `${u.name}:${u.role}`)).toEqual(['Ada:engineer', 'Zed:reviewer']);
  });

  it('orders mail newest first and filters by recipient', async () => {
    let to: string | null = null;
    server.use(http.get('*/api/admin/mail', ({ request }) => {
      to = new URL(request.url).searchParams.get('to');
      return HttpResponse.json({ messages: [
        { id: 1, from: 'varsmith@localhost', to: ['r@varsmith.test'], subject: 'old', text: '', receivedAt: '2026-11-01T00:00:00Z' },
        { id: 2, from: 'varsmith@localhost', to: ['r@varsmith.test'], subject: 'new', text: '', receivedAt: '2026-11-02T00:00:00Z' },
      ] });
    }));
    const mail = await useAdminStore().loadMail('r@varsmith.test');
    expect(to).toBe('r@varsmith.test');
    expect(mail.map((m) => m.subject)).toEqual(['new', 'old']);
  });

  it('reads one page of the mail outbox with the total of matching messages', async () => {
    let asked: URLSearchParams | null = null;
    server.use(http.get('*/api/admin/mail', ({ request }) => {
      asked = new URL(request.url).searchParams;
      return HttpResponse.json([{ id: 7, from: 'varsmith@localhost', to: ['tester@varsmith.test'], subject: 'Released', text: 'x', receivedAt: '2026-12-01T10:00:00Z' }], { headers: { 'X-Total-Count': '51' } });
    }));
    const store = useAdminStore();
    await store.loadMail('tester', { limit: 50, offset: 50 });
    expect(Object.fromEntries(asked!.entries())).toEqual({ to: 'tester', limit: '50', offset: '50' });
    expect(store.mailTotal).toBe(51);
    expect(store.mail.map((m) => m.id)).toEqual([7]);
  });
});

describe('review answer shapes', () => {
  it('takes the newest review when the server answers with the whole revision', async () => {
    setActivePinia(createPinia());
    server.use(http.post('*/api/revisions/11/reviews', () => HttpResponse.json({
      ...buildRevisionSummary({ id: 11, status: 'approved' }),
      reviews: [
        { id: 3, revisionId: 11, reviewer: TEST_USERS.reviewer, decision: 'changes', comment: 'Lower kp', createdAt: '2026-11-30T09:00:00Z' },
        { id: 7, revisionId: 11, reviewer: TEST_USERS.reviewer, decision: 'approve', comment: '', createdAt: '2026-12-01T09:00:00Z' },
      ],
    }, { status: 201 })));
    const review = await useReviewStore().decide(11, { decision: 'approve', comment: '' });
    expect(review.id).toBe(7);
    expect(review.decision).toBe('approve');
  });
});
