import 'reflect-metadata';
import { createDataSource } from '@server/data-source.ts';
import { loadEnvOrExit } from '@server/env.ts';
import { toVerifyReport } from '@server/routes/audit.routes.ts';
import { verifyAuditChain } from '@server/services/audit/verify-audit-chain.ts';

/**
 * `npm run audit:verify`: recomputes the audit chain in the database named by DATABASE_URL and
 * prints { ok, checked, firstBrokenSequence?, reason? } as JSON. Exit code 0 when the chain holds,
 * 1 when a link is broken, 2 when the database cannot be reached.
 */
const env = loadEnvOrExit();
const dataSource = createDataSource(env.DATABASE_URL, { poolSize: 1 });
try {
  await dataSource.initialize();
} catch (error) {
  console.error(`Cannot reach the database at DATABASE_URL: ${(error as Error).message}`);
  process.exit(2);
}
try {
  const report = toVerifyReport(await verifyAuditChain(dataSource.manager));
  process.stdout.write(`${JSON.stringify(report)}\n`);
  process.stdout.write(
    report.ok
      ? `The audit chain holds: ${report.checked} events checked.\n`
      : `The audit chain is broken at sequence ${report.firstBrokenSequence} (${report.reason === 'link_broken' ? 'its link to the previous row does not match' : 'its content was changed'}); ${report.checked} events before it hold.\n`,
  );
  process.exitCode = report.ok ? 0 : 1;
} finally {
  await dataSource.destroy();
}
