import type { EntityManager } from 'typeorm';

/** Signs a person out everywhere (except, optionally, the session `keepSid`). */
export async function endSessionsOf(manager: EntityManager, userId: string, keepSid?: string): Promise<void> {
  await manager.query(`DELETE FROM session WHERE sess -> 'passport' ->> 'user' = $1 AND sid <> $2`, [userId, keepSid ?? '']);
}
