import { Router } from 'express';
import { auditQuerySchema, type AuditVerifyReport } from '@shared/api/audit.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { currentUser, requireUser } from '@server/middlewares/authenticate.ts';
import { authorizeSite } from '@server/policies/site.policy.ts';
import { presentAuditEvent } from '@server/presenters/audit-event.presenter.ts';
import { recordAuditExport, writeAuditCsv } from '@server/services/audit/export-audit-csv.ts';
import { authorizeAuditQuery, listAuditEvents } from '@server/services/audit/list-audit-events.ts';
import { verifyAuditChain } from '@server/services/audit/verify-audit-chain.ts';
import { validate } from './pipeline.ts';

/** The audit trail's read side. Mounted at /api/audit (see shared/api/audit.ts). */
export function auditRoutes(deps: RouteDeps): Router {
  const router = Router();
  const { dataSource } = deps;
  router.use(requireUser);

  router.get('/', async (req, res) => {
    const { page, pageSize, format, ...rest } = validate(auditQuerySchema, req.query);
    const actor = currentUser(req);
    const filter = await authorizeAuditQuery(dataSource.manager, actor, rest);
    if (format === 'csv') {
      await dataSource.transaction((manager) => recordAuditExport(manager, actor, filter));
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="audit-${new Date().toISOString().slice(0, 10)}.csv"`);
      await writeAuditCsv(dataSource.manager, filter, res);
      res.end();
      return;
    }
    const { events, total } = await listAuditEvents(dataSource.manager, filter, { page, pageSize });
    res.json({ events: events.map(presentAuditEvent), page, pageSize, total });
  });

  router.get('/verify', async (req, res) => {
    authorizeSite(currentUser(req), 'administer');
    res.json(toVerifyReport(await verifyAuditChain(dataSource.manager)));
  });

  return router;
}

export function toVerifyReport(report: Awaited<ReturnType<typeof verifyAuditChain>>): AuditVerifyReport {
  return report.ok
    ? { ok: true, checked: report.checked }
    : { ok: false, checked: report.checked, firstBrokenSequence: report.brokenAt, reason: report.reason };
}
