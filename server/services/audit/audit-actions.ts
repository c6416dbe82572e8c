/** Every action the audit trail records. Extend here when a new write is added. */
export const AUDIT_ACTIONS = [
  'auth.signed_in',
  'auth.sign_in_failed',
  'auth.signed_out',
  'auth.password_reset_requested',
  'auth.password_reset',
  'auth.password_changed',
  'invite.created',
  'invite.accepted',
  'user.created',
  'user.updated',
  'notebook.created',
  'notebook.updated',
  'membership.added',
  'membership.changed',
  'membership.removed',
  'entry.created',
  'revision.recorded',
  'revision.restored',
  'cell.run',
] as const;
export type AuditAction = (typeof AUDIT_ACTIONS)[number];
