/**
 * Working on a chain together: share links, sending a chain, comments, the activity feed,
 * the difference between two revisions and who has a chain open (re-exported by api.ts).
 */
import { z } from 'zod';
import { email } from './account-fields';
import { chainDocumentSchema } from './chain';
import { messageFiguresField } from './chains-api';

// ------------------------------------------------------------------ sharing
export const createShareLinkSchema = z.object({
  /** Days until the link stops working; none: until revoked. */
  expiresInDays: z.number().int().min(1).max(365).optional(),
});
export interface ShareLinkDto {
  id: string;
  /** The full link; only the answer to POST carries it (the server keeps a hash). */
  url?: string;
  createdBy: string;
  createdAt: string;
  expiresAt: string | null;
}
/** GET /api/shared/:token?figures=4: the flag sentences at the reader's significant figures. */
export const sharedChainQuerySchema = z.object({
  figures: messageFiguresField(z.coerce.number).optional(),
});
/** GET /api/shared/:token: a chain for someone without an account, read-only. */
export interface SharedChainDto {
  name: string;
  description: string;
  version: number;
  updatedAt: string;
  workspaceName: string;
  document: z.infer<typeof chainDocumentSchema>;
  /** The engine's analysis with the sweep, or null when the engine refused the chain. */
  analysis: unknown;
  analysisError?: string;
  /** A chain with modes: each mode's analysis (`analysis` above is the first mode's). */
  modes?: SharedModeDto[];
}

/** One mode of a shared chain and its analysis (null, with the reason, when refused). */
export interface SharedModeDto {
  id: string;
  name: string;
  kind: 'receive' | 'transmit' | 'state';
  analysis: unknown;
  analysisError?: string;
}
export const sendChainSchema = z.object({
  email,
  note: z.string().trim().max(2000).default(''),
});

// ------------------------------------------------------------------ comments, activity
export const commentSchema = z.object({
  body: z
    .string()
    .trim()
    .min(1, 'write something')
    .max(4000, 'a comment can have at most 4000 characters'),
  /** A stage of the chain; none: a comment on the whole chain. */
  stageId: z.string().min(1).max(64).optional(),
});
export const editCommentSchema = z.object({ body: commentSchema.shape.body });
export interface CommentDto {
  id: string;
  chainId: string;
  stageId: string | null;
  body: string;
  authorId: string;
  author: string;
  createdAt: string;
  editedAt: string | null;
  /** Members mentioned by address who were told by mail (POST only). */
  notified?: string[];
  /**
   * POST only: for each mention mail that could not be sent yet, what happened (it stays in
   * the outbox and is retried; the comment itself is saved).
   */
  mailProblems?: string[];
}
export const ACTIVITY_KINDS = [
  'chain-created',
  'chain-saved',
  'chain-restored',
  'chain-deleted',
  'chain-shared',
  'chain-sent',
  'comment-added',
  'member-invited',
  'member-joined',
] as const;
export type ActivityKind = (typeof ACTIVITY_KINDS)[number];
export interface ActivityDto {
  id: string;
  kind: ActivityKind;
  actor: string;
  summary: string;
  chainId: string | null;
  /** An app path to what it is about (open with the app's router). */
  link: string | null;
  createdAt: string;
}

// ------------------------------------------------------------------ revision diff
export const diffQuerySchema = z.object({
  from: z.coerce.number().int().min(1),
  to: z.coerce.number().int().min(1),
  /** The reader's significant figures for the texts (absent: 3, key figures unpadded). */
  figures: messageFiguresField(z.coerce.number).optional(),
});
export interface ValueChangeDto {
  stageId: string;
  stageLabel: string;
  key: string;
  label: string;
  unit: string;
  before: number | string | boolean | null;
  after: number | string | boolean | null;
  /** The values in engineering notation with their units, e.g. "22.0 uH". */
  beforeText: string;
  afterText: string;
}
export interface StageRefDto {
  id: string;
  type: string;
  label: string;
  position: number;
}
export interface KeyFigureDto {
  key: string;
  label: string;
  unit: string;
  before: number | null;
  after: number | null;
  beforeText: string;
  afterText: string;
}
export interface RevisionDiffDto {
  from: number;
  to: number;
  added: StageRefDto[];
  removed: StageRefDto[];
  moved: (StageRefDto & { from: number })[];
  values: ValueChangeDto[];
  settings: { key: string; before: string; after: string }[];
  figures: KeyFigureDto[];
}

// ------------------------------------------------------------------ presence
/** Someone with a chain open (server-sent event "presence" carries the list). */
export interface PresentUserDto {
  userId: string;
  displayName: string;
}
/** Server-sent event "saved": someone stored a new version. */
export interface ChainSavedEventDto {
  chainId: string;
  version: number;
  by: string;
  byUserId: string;
}
/** Server-sent event "comments": the chain's comments changed. */
export interface CommentsChangedEventDto {
  chainId: string;
  by: string;
}
