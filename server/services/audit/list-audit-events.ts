import type { EntityManager, SelectQueryBuilder } from 'typeorm';
import type { AuditQuery } from '@shared/api/audit.ts';
import { AuditEventEntity } from '@server/entities/audit-event.entity.ts';
import { EntryEntity } from '@server/entities/entry.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { ForbiddenError, NotFoundError, ValidationError } from '@server/errors/index.ts';
import type { AuditEventWithActor, AuditEventWithReferences } from '@server/presenters/audit-event.presenter.ts';
import { notebookRoleOf } from '@server/services/entries/notebook-role.ts';
import { referencesOf, resolveAuditReferences } from './resolve-audit-references.ts';

export type AuditFilter = Omit<AuditQuery, 'page' | 'pageSize' | 'format'>;

/**
 * Who may read which part of the trail:
 * - an entry's or a notebook's events: that notebook's PIs and administrators;
 * - one person's events (actorId alone): that person and administrators;
 * - everything: administrators.
 * A non-member asking for a notebook's events is told it does not exist (404).
 * Returns the filter with the entry's notebook filled in.
 */
export async function authorizeAuditQuery(manager: EntityManager, actor: UserEntity, filter: AuditFilter): Promise<AuditFilter> {
  const admin = actor.siteRole === 'administrator';
  let notebookId = filter.notebookId;
  if (filter.entryId) {
    const entry = await manager.findOne(EntryEntity, { where: { id: filter.entryId }, select: { id: true, notebookId: true } });
    if (!entry || (notebookId && entry.notebookId !== notebookId)) throw new NotFoundError('No such entry');
    notebookId = entry.notebookId;
  }
  if (notebookId) {
    if (admin) return { ...filter, notebookId };
    const role = await notebookRoleOf(manager, notebookId, actor.id);
    if (role === null) throw new NotFoundError(filter.entryId ? 'No such entry' : 'No such notebook');
    if (role !== 'pi') throw new ForbiddenError('Only the notebook’s PIs and administrators can read its audit trail');
    return { ...filter, notebookId };
  }
  if (filter.actorId) {
    if (admin || filter.actorId === actor.id) return filter;
    throw new ForbiddenError('You can read only your own audit trail');
  }
  if (!admin) throw new ForbiddenError('Only administrators can read the whole audit trail; choose a notebook, an entry or yourself');
  return filter;
}

/** `to` as a bare date covers that whole day (UTC). */
function upperBound(to: string): Date {
  return /^\d{4}-\d{2}-\d{2}$/.test(to) ? new Date(Date.parse(`${to}T00:00:00Z`) + 86_400_000) : new Date(to);
}

/** The filtered query (without ordering or paging), with the actor's name selected. */
export function auditQueryBuilder(manager: EntityManager, filter: AuditFilter): SelectQueryBuilder<AuditEventEntity> {
  if (filter.from && filter.to && new Date(filter.from) >= upperBound(filter.to)) {
    throw new ValidationError('The date range is empty', [{ path: 'to', message: '"to" must be after "from"' }]);
  }
  const qb = manager.createQueryBuilder(AuditEventEntity, 'e').leftJoin(UserEntity, 'u', 'u.id = e.actor_id').addSelect('u.name', 'actor_name');
  if (filter.notebookId) qb.andWhere('e.notebook_id = :notebookId', { notebookId: filter.notebookId });
  if (filter.entryId) qb.andWhere(`(e.entity_id = :entryId OR e.summary->>'entryId' = :entryId)`, { entryId: filter.entryId });
  if (filter.actorId) qb.andWhere('e.actor_id = :actorId', { actorId: filter.actorId });
  if (filter.action) {
    if (filter.action.includes('.')) qb.andWhere('e.action = :action', { action: filter.action });
    else qb.andWhere(`e.action LIKE :prefix`, { prefix: `${filter.action}.%` });
  }
  if (filter.from) qb.andWhere('e.occurred_at >= :from', { from: new Date(filter.from) });
  if (filter.to) qb.andWhere('e.occurred_at < :to', { to: upperBound(filter.to) });
  return qb;
}

/** Raw rows to entities with the actor's name. */
export async function fetchWithActor(qb: SelectQueryBuilder<AuditEventEntity>): Promise<AuditEventWithActor[]> {
  const { entities, raw } = await qb.getRawAndEntities<{ actor_name: string | null }>();
  return entities.map((e, i) => Object.assign(e, { actorName: raw[i]?.actor_name ?? null }));
}

/**
 * One page of matching events, newest first, and the total count; each event with its ids in
 * words (entry titles, notebook names, people's names, revision numbers, cell names), resolved
 * for the whole page at once.
 */
export async function listAuditEvents(
  manager: EntityManager,
  filter: AuditFilter,
  page: { page: number; pageSize: number },
): Promise<{ events: AuditEventWithReferences[]; total: number }> {
  const total = await auditQueryBuilder(manager, filter).getCount();
  const events = await fetchWithActor(
    auditQueryBuilder(manager, filter)
      .orderBy('e.seq', 'DESC')
      .offset((page.page - 1) * page.pageSize)
      .limit(page.pageSize),
  );
  const references = await resolveAuditReferences(manager, events);
  return { events: events.map((e) => Object.assign(e, { references: referencesOf(e, references) })), total };
}
