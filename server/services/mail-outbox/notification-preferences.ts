import type { EntityManager } from 'typeorm';
import { NOTIFICATION_KINDS, type NotificationKind } from '@shared/api/notifications.ts';
import { NotificationPreferenceEntity } from '@server/entities/notification-preference.entity.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';

export type Preferences = Record<NotificationKind, boolean>;

/** Every kind for one person: on unless they turned it off. */
export async function getPreferences(manager: EntityManager, userId: string): Promise<Preferences> {
  const rows = await manager.find(NotificationPreferenceEntity, { where: { userId } });
  const prefs = Object.fromEntries(NOTIFICATION_KINDS.map((k) => [k, true])) as Preferences;
  for (const row of rows) if ((NOTIFICATION_KINDS as readonly string[]).includes(row.kind)) prefs[row.kind] = row.enabled;
  return prefs;
}

/** Whether the person wants mail of this kind. */
export async function wantsMail(manager: EntityManager, userId: string, kind: NotificationKind): Promise<boolean> {
  const row = await manager.findOne(NotificationPreferenceEntity, { where: { userId, kind } });
  return row?.enabled ?? true;
}

/** Changes the given kinds for the actor; audited with before and after. */
export async function updatePreferences(ctx: ActingContext, changes: Partial<Preferences>): Promise<Preferences> {
  const before = await getPreferences(ctx.manager, ctx.actor.id);
  for (const kind of NOTIFICATION_KINDS) {
    const enabled = changes[kind];
    if (enabled === undefined) continue;
    await ctx.manager.upsert(NotificationPreferenceEntity, { userId: ctx.actor.id, kind, enabled }, ['userId', 'kind']);
  }
  const after = await getPreferences(ctx.manager, ctx.actor.id);
  await recordEvent(ctx.manager, {
    actorId: ctx.actor.id,
    action: 'notifications.updated',
    entityType: 'user',
    entityId: ctx.actor.id,
    summary: { before, after },
  });
  return after;
}
