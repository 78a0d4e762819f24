// POST /api/analyze (CONTRACT section 6).
import { analyzeQuerySchema, analyzeRequestSchema } from '../../shared/api/analyze';
import { ALL_ROLES, route } from '../middleware/route';
import { analyze } from './service';

/** Routes of /api/analyze. */
export const analyzeRoutes = [
  route({
    method: 'post', path: '/analyze', access: ALL_ROLES, schema: { body: analyzeRequestSchema, query: analyzeQuerySchema },
    handler: async ({ input, res }) => { res.json(await analyze(input.body.design, input.query.plots === '1')); },
  }),
];
