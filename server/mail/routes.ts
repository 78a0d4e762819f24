// Captured mail for admins.
import { listMailQuerySchema } from '../../shared/api/admin';
import { sendPage } from '../middleware/page';
import { route } from '../middleware/route';
import { presentMail } from './presenter';
import { capturedMail } from './service';

/** Routes of /api/admin/mail. */
export const mailRoutes = [
  route({
    method: 'get', path: '/admin/mail', access: ['admin'], schema: { query: listMailQuerySchema },
    handler: async ({ input, res }) => {
      const { rows, total } = await capturedMail(input.query);
      sendPage(res, rows.map(presentMail), total);
    },
  }),
];
