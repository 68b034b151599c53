import { ActivitySchema } from '../activity/activity.entity';
import { PasswordResetSchema, PendingRegistrationSchema } from '../auth/account-token.entity';
import { ChainSchema } from '../chains/chain.entity';
import { CommentSchema } from '../comments/comment.entity';
import { OutboxMessageSchema } from '../mail/outbox.entity';
import { PresenceSchema } from '../presence/presence.entity';
import { ShareLinkSchema } from '../sharing/share-link.entity';
import { InvitationSchema } from '../workspaces/invitation.entity';
import { ChainRevisionSchema } from '../chains/revision.entity';
import { DataFileSchema } from '../files/data-file.entity';
import { PartSchema } from '../parts/part.entity';
import { RateLimitHitSchema } from './rate-limit-hit.entity';
import { StudySchema } from '../studies/study.entity';
import { SiteSettingSchema } from '../users/site-setting.entity';
import { UserSchema } from '../users/user.entity';
import { MembershipSchema } from '../workspaces/membership.entity';
import { WorkspaceSchema } from '../workspaces/workspace.entity';

/** Every entity, for the ORM configuration (order does not matter). */
export const ENTITIES = [
  UserSchema,
  SiteSettingSchema,
  WorkspaceSchema,
  MembershipSchema,
  ChainSchema,
  ChainRevisionSchema,
  DataFileSchema,
  PartSchema,
  RateLimitHitSchema,
  StudySchema,
  InvitationSchema,
  PasswordResetSchema,
  PendingRegistrationSchema,
  OutboxMessageSchema,
  ShareLinkSchema,
  CommentSchema,
  ActivitySchema,
  PresenceSchema,
];
