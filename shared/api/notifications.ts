import { z } from 'zod';

/**
 * Which e-mails a person receives.
 *
 * GET /api/account/notifications                         -> notificationPreferences (every kind, on unless turned off)
 * PUT /api/account/notifications   updateNotifications   -> notificationPreferences (only the kinds given change)
 */
export const NOTIFICATION_KINDS = ['review-requested', 'review-decided', 'comment-reply', 'mention'] as const;
export type NotificationKind = (typeof NOTIFICATION_KINDS)[number];

export const NOTIFICATION_KIND_LABELS: Record<NotificationKind, string> = {
  'review-requested': 'An entry is submitted for my review',
  'review-decided': 'My entry is approved or changes are requested',
  'comment-reply': 'Someone replies to my comment',
  mention: 'Someone mentions me in a comment',
};

export const notificationPreferencesSchema = z.object({
  preferences: z.object(Object.fromEntries(NOTIFICATION_KINDS.map((k) => [k, z.boolean()])) as Record<NotificationKind, z.ZodBoolean>),
});
export type NotificationPreferences = z.infer<typeof notificationPreferencesSchema>;

export const updateNotificationsSchema = z.object({
  preferences: z
    .object(Object.fromEntries(NOTIFICATION_KINDS.map((k) => [k, z.boolean({ message: `${k} must be true or false` }).optional()])) as Record<NotificationKind, z.ZodOptional<z.ZodBoolean>>)
    .strict(),
});
export type UpdateNotificationsInput = z.input<typeof updateNotificationsSchema>;
