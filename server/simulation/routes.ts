// Whole-system simulation routes (CONTRACT section 10 over HTTP).
import { idParamsSchema } from '../../shared/api/common';
import { revisionSimulationQuerySchema, simulateRequestSchema } from '../../shared/api/simulation';
import { route } from '../middleware/route';
import { presentRevisionRun } from './presenter';
import { revisionRun, simulateDesign } from './service';

/** Routes of /api/simulate and /api/revisions/:id/simulation. */
export const simulationRoutes = [
  route({
    method: 'post', path: '/simulate', access: ['engineer', 'reviewer'], schema: { body: simulateRequestSchema },
    handler: async ({ input, app, res }) => { res.json(await simulateDesign(app, input.body)); },
  }),
  route({
    method: 'get', path: '/revisions/:id/simulation', access: ['engineer', 'reviewer', 'admin'], schema: { params: idParamsSchema, query: revisionSimulationQuerySchema },
    handler: async ({ input, app, res }) => { res.json(presentRevisionRun(await revisionRun(app, input.params.id, input.query))); },
  }),
];
