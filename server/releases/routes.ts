// Release routes (CONTRACT section 6); the read routes accept read-only access tokens.
import { idParamsSchema } from '../../shared/api/common';
import { createReleaseRequestSchema, listReleasesQuerySchema, withdrawReleaseRequestSchema } from '../../shared/api/releases';
import { ALL_ROLES, route } from '../middleware/route';
import { sendPage } from '../middleware/page';
import { releaseView } from '../revisions/view';
import { presentRelease } from './presenter';
import { downloadRelease, getRelease, listReleases, release, releaseReport, withdrawRelease } from './service';

/** Routes of /api/revisions/:id/release and /api/releases. */
export const releaseRoutes = [
  route({
    method: 'post', path: '/revisions/:id/release', access: ['engineer', 'admin'], schema: { params: idParamsSchema, body: createReleaseRequestSchema },
    handler: async ({ input, actor, app, res }) => { res.status(201).json(await releaseView(await release(app, actor, input.params.id, input.body.version))); },
  }),
  route({
    method: 'get', path: '/releases', access: ALL_ROLES, tokens: true, schema: { query: listReleasesQuerySchema },
    handler: async ({ input, res }) => {
      const { rows, total } = await listReleases(input.query);
      sendPage(res, rows.map((r) => presentRelease(r, r)), total);
    },
  }),
  route({
    method: 'get', path: '/releases/:id', access: ALL_ROLES, tokens: true, schema: { params: idParamsSchema },
    handler: async ({ input, res }) => { res.json(await releaseView(await getRelease(input.params.id))); },
  }),
  route({
    method: 'get', path: '/releases/:id/bundle', access: ALL_ROLES, tokens: true, schema: { params: idParamsSchema },
    handler: async ({ input, actor, app, res }) => {
      const { row, bytes } = await downloadRelease(app, actor, input.params.id);
      res.set({ 'Content-Type': 'application/zip', 'Content-Disposition': `attachment; filename="${row.fileName}"`, 'X-Content-SHA256': row.sha256, 'Cache-Control': 'no-store' });
      res.send(bytes);
    },
  }),
  route({
    method: 'get', path: '/releases/:id/report', access: ALL_ROLES, schema: { params: idParamsSchema },
    handler: async ({ input, res }) => { res.type('text/markdown; charset=utf-8').set('Cache-Control', 'no-store').send(await releaseReport(input.params.id)); },
  }),
  route({
    method: 'post', path: '/releases/:id/withdraw', access: ['engineer', 'admin'], schema: { params: idParamsSchema, body: withdrawReleaseRequestSchema },
    handler: async ({ input, actor, app, res }) => { res.json(await releaseView(await withdrawRelease(app, actor, input.params.id, input.body.reason))); },
  }),
];
