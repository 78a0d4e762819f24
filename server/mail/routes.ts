// Captured mail for admins.
import { listMailQuerySchema } from '../../shared/api/admin';
import { route } from '../middleware/route';
import { presentMail } from './presenter';
import { capturedMail } from './service';

/** Routes of /api/admin/mail. */
export const mailRoutes = [
  route({
    method: 'get', path: '/admin/mail', access: ['admin'], schema: { query: listMailQuerySchema },
    handler: async ({ input, res }) => { res.json((await capturedMail(input.query)).map(presentMail)); },
  }),
];
