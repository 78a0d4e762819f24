// Design routes (CONTRACT section 6).
import { idParamsSchema } from '../../shared/api/common';
import { createDesignRequestSchema, listDesignsQuerySchema, saveDesignRequestSchema } from '../../shared/api/designs';
import { route } from '../middleware/route';
import { presentDesignDetail, presentDesignSummary } from './presenter';
import { relationsOf, relationsOfAll } from './relations';
import { sendPage } from '../middleware/page';
import { createDesign, getDesign, listDesigns, saveDesign } from './service';
import { draftBundle } from '../releases/service';

/** Routes of /api/designs. */
export const designRoutes = [
  route({
    method: 'get', path: '/designs', access: ['engineer', 'reviewer', 'admin'], schema: { query: listDesignsQuerySchema },
    handler: async ({ input, res }) => {
      const { rows, total } = await listDesigns(input.query);
      const relations = await relationsOfAll(rows);
      sendPage(res, rows.map((r, i) => presentDesignSummary(r, relations[i])), total);
    },
  }),
  route({
    method: 'post', path: '/designs', access: ['engineer'], schema: { body: createDesignRequestSchema },
    handler: async ({ input, actor, app, res }) => {
      const row = await createDesign(app, actor, input.body.design);
      res.status(201).json(presentDesignDetail(row, await relationsOf(row)));
    },
  }),
  route({
    method: 'get', path: '/designs/:id', access: ['engineer'], schema: { params: idParamsSchema },
    handler: async ({ input, res }) => {
      const row = await getDesign(input.params.id);
      res.json(presentDesignDetail(row, await relationsOf(row)));
    },
  }),
  route({
    method: 'put', path: '/designs/:id', access: ['engineer'], schema: { params: idParamsSchema, body: saveDesignRequestSchema },
    handler: async ({ input, actor, app, res }) => {
      const row = await saveDesign(app, actor, input.params.id, input.body.design, input.body.baseVersion);
      res.json(presentDesignDetail(row, await relationsOf(row)));
    },
  }),
  route({
    method: 'post', path: '/designs/:id/draft-bundle', access: ['engineer'], schema: { params: idParamsSchema },
    handler: async ({ input, actor, app, res }) => {
      const bundle = await draftBundle(app, actor, input.params.id);
      res.set({ 'Content-Type': 'application/zip', 'Content-Disposition': `attachment; filename="${bundle.fileName}"`, 'X-Content-SHA256': bundle.sha256 });
      res.send(bundle.zip);
    },
  }),
];
