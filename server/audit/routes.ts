// The audit log for admins.
import { listAuditQuerySchema } from '../../shared/api/admin';
import { route } from '../middleware/route';
import { presentAudit } from './presenter';
import { searchAudit } from './service';

/** Routes of /api/admin/audit. */
export const auditRoutes = [
  route({
    method: 'get', path: '/admin/audit', access: ['admin'], schema: { query: listAuditQuerySchema },
    handler: async ({ input, res }) => { res.json((await searchAudit(input.query)).map(presentAudit)); },
  }),
];
