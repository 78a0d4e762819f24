// Review route (CONTRACT section 6).
import { idParamsSchema } from '../../shared/api/common';
import { createReviewRequestSchema } from '../../shared/api/revisions';
import { route } from '../middleware/route';
import { getRevision } from '../revisions/service';
import { revisionDetailView } from '../revisions/view';
import { decide } from './service';

/** Routes of /api/revisions/:id/reviews. */
export const reviewRoutes = [
  route({
    method: 'post', path: '/revisions/:id/reviews', access: ['reviewer'], schema: { params: idParamsSchema, body: createReviewRequestSchema },
    handler: async ({ input, actor, app, res }) => {
      await decide(app, actor, input.params.id, input.body);
      res.status(201).json(await revisionDetailView(await getRevision(input.params.id)));
    },
  }),
];
