// The audit log for admins.
import { listAuditQuerySchema } from '../../shared/api/admin';
import { sendPage } from '../middleware/page';
import { route } from '../middleware/route';
import { presentAudit } from './presenter';
import { searchAudit } from './service';
import { targetLabelOf, targetLabels } from './targets';

/** Routes of /api/admin/audit. */
export const auditRoutes = [
  route({
    method: 'get', path: '/admin/audit', access: ['admin'], schema: { query: listAuditQuerySchema },
    handler: async ({ input, res }) => {
      const { rows, total } = await searchAudit(input.query);
      const labels = await targetLabels(rows);
      sendPage(res, rows.map((row) => presentAudit(row, targetLabelOf(labels, row))), total);
    },
  }),
];
