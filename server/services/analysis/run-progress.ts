import type { EntityManager } from 'typeorm';
import { ACTIVE_RUN_STATUSES, AnalysisRunEntity } from '@server/entities/analysis-run.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';

/** The cell's own run in progress on any instance (queued or running), with who started it; null when none. */
export async function findActiveRun(
  manager: EntityManager,
  props: { entryId: string; cellId: string },
): Promise<(AnalysisRunEntity & { startedBy: UserEntity }) | null> {
  const run = await manager
    .createQueryBuilder(AnalysisRunEntity, 'r')
    .innerJoinAndSelect('r.startedBy', 'startedBy')
    .where(`r.entry_id = :entryId AND r.cell_id = :cellId AND r.purpose = 'cell'`, props)
    .andWhere('r.status IN (:...active)', { active: ACTIVE_RUN_STATUSES })
    .getOne();
  return run?.startedBy ? (run as AnalysisRunEntity & { startedBy: UserEntity }) : null;
}
