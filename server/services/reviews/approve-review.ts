import type { DataSource } from 'typeorm';
import type { ReproducibilityReport } from '@shared/api/reviews.ts';
import type { AnalysisPool } from '@server/analysis/analysis-pool.ts';
import type { RunQueue } from '@server/analysis/run-queue.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { RevisionEntity } from '@server/entities/revision.entity.ts';
import { SignatureEntity } from '@server/entities/signature.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import type { ReviewEntity } from '@server/entities/review.entity.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import { verifyPassword } from '@server/services/auth/passwords.ts';
import { loadEntry } from '@server/services/entries/load-entry.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { rerunCell, rerunCellInPool } from '@server/services/analysis/run-cell.ts';
import { checkReproducibility, type RerunCell } from '@server/services/reproducibility/check-revision.ts';
import { closeReview } from './close-review.ts';
import { loadOpenReview } from './load-open-review.ts';
import { NotReproducedError } from './not-reproduced.error.ts';
import { SignatureFailedError } from './signature-failed.error.ts';

export interface ApproveDeps {
  dataSource: DataSource;
  /**
   * Where the reproducibility reruns are computed: the shared run queue (by whichever instance has
   * a free worker), or a pool of this process (the demo seed, which signs before any server runs).
   */
  reruns: { queue: RunQueue } | { pool: AnalysisPool };
  publicUrl: string;
  /** Total time for the reproducibility rerun. */
  reproduceBudgetMs?: number;
}

export interface ApproveProps {
  actor: UserEntity;
  notebookId: string;
  entryId: string;
  revisionId: string;
  password: string;
  acceptDifferences: boolean;
}

/**
 * Approval as an electronic signature (21 CFR Part 11):
 * 1. the PI (not the entry's author) re-enters their password — §11.200(a)(1) asks for two
 *    distinct identification components; the session supplies the first, the password the second.
 *    A wrong password signs nothing and is audited as "review.signature_failed";
 * 2. every cell of the revision is rerun with the current engine and compared with the stored
 *    results; when they differ the PI must confirm (acceptDifferences), and the report is kept
 *    with the signature either way;
 * 3. in one transaction: the signature row — printed name, date and time, meaning (§11.50(a)) —
 *    bound to the revision's content hash by a foreign key (§11.70: it cannot be moved to another
 *    record), the review and entry marked approved, the audit event, the author's mail.
 */
export async function approveReview(deps: ApproveDeps, props: ApproveProps): Promise<{ review: ReviewEntity; signature: SignatureEntity }> {
  const { dataSource } = deps;
  const reading: ActingContext = { actor: props.actor, manager: dataSource.manager };
  const entry = await loadEntry(reading, { notebookId: props.notebookId, entryId: props.entryId, action: 'read' });
  const review = await loadOpenReview(reading, { entry, action: 'decide', revisionId: props.revisionId });

  const signer = await dataSource.manager.findOneByOrFail(UserEntity, { id: props.actor.id });
  if (!(await verifyPassword(signer.passwordHash, props.password))) {
    await dataSource.transaction((manager) =>
      recordEvent(manager, {
        actorId: signer.id,
        action: 'review.signature_failed',
        entityType: 'review',
        entityId: review.id,
        notebookId: entry.notebookId,
        summary: { entryId: entry.id, revisionId: review.revisionId, reason: 'wrong password' },
      }),
    );
    throw new SignatureFailedError();
  }

  const revision = await dataSource.manager.findOneByOrFail(RevisionEntity, { id: review.revisionId });
  const reproducibility: ReproducibilityReport = await checkReproducibility(reruns(deps, signer, entry), revision, { totalBudgetMs: deps.reproduceBudgetMs });
  if (reproducibility.status === 'differs' && !props.acceptDifferences) throw new NotReproducedError(reproducibility);

  return dataSource.transaction(async (manager) => {
    const ctx: ActingContext = { actor: signer, manager };
    const locked = await loadEntry(ctx, { notebookId: props.notebookId, entryId: props.entryId, action: 'read', lock: true });
    // The review may have moved on to a newer revision while the cells were rerun.
    const current = await loadOpenReview(ctx, { entry: locked, action: 'decide', revisionId: revision.id });
    const signature = await manager.save(
      manager.create(SignatureEntity, {
        revisionId: revision.id,
        contentHash: revision.contentHash,
        reviewId: current.id,
        signerId: signer.id,
        printedName: signer.name,
        meaning: 'approved',
        signedAt: new Date(),
        reproducibility,
      }),
    );
    await closeReview(ctx, {
      entry: locked,
      review: current,
      status: 'approved',
      reproduced: reproducibility.status !== 'differs',
      publicUrl: deps.publicUrl,
    });
    await recordEvent(manager, {
      actorId: signer.id,
      action: 'review.approved',
      entityType: 'review',
      entityId: current.id,
      notebookId: locked.notebookId,
      summary: {
        entryId: locked.id,
        revisionId: revision.id,
        signatureId: signature.id,
        contentHash: revision.contentHash,
        printedName: signer.name,
        meaning: 'approved',
        reproducibility: reproducibility.status,
        before: { status: locked.status },
        after: { status: 'approved' },
      },
    });
    return { review: current, signature };
  });
}

/** The reproducibility check alone, for the PI to look at before signing. */
export async function previewReproducibility(
  deps: Pick<ApproveDeps, 'dataSource' | 'reruns' | 'reproduceBudgetMs'>,
  props: { actor: UserEntity; notebookId: string; entryId: string },
): Promise<ReproducibilityReport> {
  const reading: ActingContext = { actor: props.actor, manager: deps.dataSource.manager };
  const entry = await loadEntry(reading, { notebookId: props.notebookId, entryId: props.entryId, action: 'read' });
  const review = await loadOpenReview(reading, { entry, action: 'decide' });
  const revision = await deps.dataSource.manager.findOneByOrFail(RevisionEntity, { id: review.revisionId });
  return checkReproducibility(reruns(deps, props.actor, entry), revision, { totalBudgetMs: deps.reproduceBudgetMs });
}

/** The check's reruns of the entry's cells, queued in the PI's name as reproducibility runs. */
function reruns(deps: Pick<ApproveDeps, 'dataSource' | 'reruns'>, actor: UserEntity, entry: EntryEntity): RerunCell {
  const { dataSource, reruns: where } = deps;
  if ('queue' in where) return (props) => rerunCell({ dataSource, queue: where.queue }, { actor, entry, ...props });
  return ({ signal: _uncancellable, ...props }) => rerunCellInPool({ dataSource, pool: where.pool }, { actor, entry, ...props });
}
