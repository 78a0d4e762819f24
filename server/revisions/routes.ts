// Revision routes (CONTRACT section 6).
import { idParamsSchema } from '../../shared/api/common';
import { diffParamsSchema, listRevisionsQuerySchema, submitRevisionRequestSchema } from '../../shared/api/revisions';
import { route } from '../middleware/route';
import { diffRevisions, getRevision, revisionHeader, revisionsOfDesign, submitRevision } from './service';
import { sendPage } from '../middleware/page';
import { revisionDetailView, revisionListItemViews } from './view';

const readers: ['engineer', 'reviewer', 'admin'] = ['engineer', 'reviewer', 'admin'];

/** Routes of /api/designs/:id/revisions and /api/revisions. */
export const revisionRoutes = [
  route({
    method: 'post', path: '/designs/:id/revisions', access: ['engineer'], schema: { params: idParamsSchema, body: submitRevisionRequestSchema },
    handler: async ({ input, actor, app, res }) => {
      res.status(201).json(await revisionDetailView(await submitRevision(app, actor, input.params.id, input.body.summary)));
    },
  }),
  route({
    method: 'get', path: '/designs/:id/revisions', access: readers, schema: { params: idParamsSchema, query: listRevisionsQuerySchema },
    handler: async ({ input, res }) => {
      const { rows, total } = await revisionsOfDesign(input.params.id, input.query);
      sendPage(res, await revisionListItemViews(rows), total);
    },
  }),
  route({
    method: 'get', path: '/revisions/:id', access: readers, schema: { params: idParamsSchema },
    handler: async ({ input, res }) => { res.json(await revisionDetailView(await getRevision(input.params.id))); },
  }),
  route({
    method: 'get', path: '/revisions/:id/header', access: readers, schema: { params: idParamsSchema },
    handler: async ({ input, res }) => { res.type('text/x-c').send(await revisionHeader(input.params.id)); },
  }),
  route({
    method: 'get', path: '/revisions/:a/diff/:b', access: readers, schema: { params: diffParamsSchema },
    handler: async ({ input, res }) => { res.json(await diffRevisions(input.params.a, input.params.b)); },
  }),
];
