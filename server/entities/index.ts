import { AnalysisResultEntity } from './analysis-result.entity.ts';
import { AnalysisRunEntity } from './analysis-run.entity.ts';
import { RateLimitHitEntity } from './rate-limit-hit.entity.ts';
import { AuditEventEntity } from './audit-event.entity.ts';
import { EntryDraftEntity } from './entry-draft.entity.ts';
import { EntryEntity } from './entry.entity.ts';
import { RevisionEntity } from './revision.entity.ts';
import { InviteEntity } from './invite.entity.ts';
import { MembershipEntity } from './membership.entity.ts';
import { NotebookEntity } from './notebook.entity.ts';
import { PasswordResetEntity } from './password-reset.entity.ts';
import { UserEntity } from './user.entity.ts';
import { AttachmentEntity } from './attachment.entity.ts';
import { FigureEntity } from './figure.entity.ts';
import { MeasurementSetEntity } from './measurement-set.entity.ts';
import { CommentEntity } from './comment.entity.ts';
import { MailMessageEntity } from './mail-message.entity.ts';
import { NotificationPreferenceEntity } from './notification-preference.entity.ts';
import { ReviewEntity } from './review.entity.ts';
import { SignatureEntity } from './signature.entity.ts';

export { AnalysisResultEntity, AnalysisRunEntity, RateLimitHitEntity, EntryDraftEntity, EntryEntity, RevisionEntity };
export { CommentEntity, MailMessageEntity, NotificationPreferenceEntity, ReviewEntity, SignatureEntity };
export { AuditEventEntity, InviteEntity, MembershipEntity, NotebookEntity, PasswordResetEntity, UserEntity };

/** Every entity the DataSource knows. Register a new entity with one line here. */
export const ENTITIES = [UserEntity, NotebookEntity, MembershipEntity, InviteEntity, PasswordResetEntity, AuditEventEntity, EntryEntity, RevisionEntity, EntryDraftEntity, AnalysisResultEntity, ReviewEntity, SignatureEntity, CommentEntity, MailMessageEntity, NotificationPreferenceEntity, AttachmentEntity, FigureEntity, MeasurementSetEntity, AnalysisRunEntity, RateLimitHitEntity];
