/**
 * Request bodies and response shapes of the JSON API under /api. The server validates
 * every body with these schemas; the client's forms use the same ones.
 *
 * Errors are always JSON: { error: string (a code), message: string, details?: unknown }.
 * Status codes: 400 malformed / 422 invalid field (details: [{ path, message }]),
 * 401 not signed in, 403 role too low, 404, 409 conflict (stale version: details
 * carries { currentVersion }), 413 body too large, 429 too many sign-in attempts.
 *
 * State-changing requests carry the CSRF token from GET /api/auth/csrf in the
 * `x-csrf-token` header.
 */
import { z } from 'zod';
import { chainDocumentSchema } from './chain';
import { sweepTracesSchema, type AnalysisDto } from './sweep-columns';

export const ROLES = ['owner', 'editor', 'viewer'] as const;
export type WorkspaceRole = (typeof ROLES)[number];
export const SITE_ROLES = ['admin', 'user'] as const;
export type SiteRole = (typeof SITE_ROLES)[number];

const email = z.string().trim().toLowerCase().email('enter a valid e-mail address').max(254);
const password = z
  .string()
  .min(10, 'a password needs at least 10 characters')
  .max(200, 'a password may have at most 200 characters');

// ------------------------------------------------------------------ auth
export const registerSchema = z.object({
  email,
  displayName: z.string().trim().min(1, 'enter a display name').max(80),
  password,
});
export const loginSchema = z.object({ email, password: z.string().min(1).max(200) });
export const changePasswordSchema = z.object({
  currentPassword: z.string().min(1).max(200),
  newPassword: password,
});
export const siteSettingsSchema = z.object({ openRegistration: z.boolean() });
/** PATCH /api/admin/users/:id: deactivate (`active: false`) or reactivate an account. */
export const adminUserUpdateSchema = z.object({ active: z.boolean() }).strict();

/** A row of the admin's account list. */
export interface AdminUserDto extends UserDto {
  createdAt: string;
  /** False once an admin deactivated (or deleted) the account: it cannot sign in. */
  active: boolean;
  /** True once deleted: the address and name are erased, the chains it wrote stay. */
  deleted: boolean;
}
/** DELETE /api/admin/users/:id: what happened to the account's workspaces. */
export interface AccountDeletedDto {
  /** Workspaces it was the only member of: deleted with their chains and files. */
  deletedWorkspaces: { id: string; name: string; chainCount: number }[];
  /** Workspaces shared with others: it left them; their chains stay, credited to "Deleted account". */
  leftWorkspaces: { id: string; name: string; chainCount: number }[];
}

export interface UserDto {
  id: string;
  email: string;
  displayName: string;
  siteRole: SiteRole;
}
export interface MembershipDto {
  workspaceId: string;
  workspaceName: string;
  role: WorkspaceRole;
}
/** POST /api/auth/login and /api/auth/register answer this; the session is new, so is the CSRF token. */
export interface SignedInDto {
  user: UserDto;
  csrfToken: string;
}
/** GET /api/me */
export interface MeDto {
  user: UserDto;
  memberships: MembershipDto[];
  /**
   * Site admins only: whether mail goes to the local development catcher, whose messages
   * the development mailbox page lists (absent for everyone else).
   */
  mailCatcher?: boolean;
}

// ------------------------------------------------------------------ workspaces
export const workspaceNameSchema = z.object({
  name: z.string().trim().min(1, 'a workspace needs a name').max(120),
});
export interface WorkspaceDto {
  id: string;
  name: string;
  role: WorkspaceRole;
}
export const addMemberSchema = z.object({ email, role: z.enum(ROLES) });
export const changeRoleSchema = z.object({ role: z.enum(ROLES) });
export interface MemberDto {
  userId: string;
  email: string;
  displayName: string;
  role: WorkspaceRole;
}

// ------------------------------------------------------------------ chains
/**
 * Body of POST /api/workspaces/:wid/chains/import: an exported chain file's text. The server
 * parses it so a malformed file is refused with its line and column (422), a file over the
 * size limit with 413.
 */
export const importChainSchema = z.object({
  text: z.string({ error: 'send the chain file\'s content as "text"' }),
  /** The file's name, for messages and the revision note. */
  fileName: z.string().max(200).optional(),
});
export type ImportChainBody = z.infer<typeof importChainSchema>;

export const createChainSchema = z
  .object({
    document: chainDocumentSchema.optional(),
    /** Key of an example from GET /api/examples, instead of a document. */
    fromExample: z.string().max(80).optional(),
    /** Overrides the document's or example's name. */
    name: z.string().trim().min(1).max(200).optional(),
    message: z.string().max(500).optional(),
  })
  .refine((b) => !!b.document !== !!b.fromExample, {
    message: 'send either a document or fromExample, not both and not neither',
  });

export const updateChainSchema = z.object({
  /** The version the client last read; a stale one gives 409 and nothing is written. */
  version: z.number().int().min(1),
  document: chainDocumentSchema,
  message: z.string().max(500).optional(),
});

export const duplicateChainSchema = z.object({
  name: z.string().trim().min(1).max(200).optional(),
  /** Keep the copy linked to its parent for comparison. */
  asVariant: z.boolean().default(false),
  /** Duplicate this document instead of the stored one (used to keep unsaved edits). */
  document: chainDocumentSchema.optional(),
});

export const restoreRevisionSchema = z.object({ version: z.number().int().min(1) });

export const listChainsQuerySchema = z.object({
  q: z.string().max(200).optional(),
  page: z.coerce.number().int().min(0).default(0),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
  sort: z.enum(['name', 'f0Hz', 'stageCount', 'flagCount', 'updatedAt']).default('updatedAt'),
  dir: z.enum(['asc', 'desc']).default('desc'),
});

export interface ChainSummaryDto {
  id: string;
  workspaceId: string;
  name: string;
  description: string;
  f0Hz: number;
  stageCount: number;
  /**
   * Flags (warning + error) found by the analysis at the last save; null when the chain
   * could not be analysed then (unknown).
   */
  flagCount: number | null;
  version: number;
  parentId: string | null;
  /** Chains that name this one as their parent (set by the workspace's chain list only). */
  variantCount?: number;
  createdBy: string;
  updatedBy: string;
  updatedAt: string;
}
/** GET /api/chains/:id/family: the root first, then every chain whose parent is listed. */
export type ChainFamilyDto = ChainSummaryDto[];
export interface ChainListDto {
  items: ChainSummaryDto[];
  total: number;
  page: number;
  pageSize: number;
}
/** Answer of a chain import: the new chain, and stages whose data file stayed behind. */
export interface ChainImportDto {
  chain: ChainDto;
  /** Stages that referred to a data file this workspace does not hold (now detached). */
  detachedDataFiles: { stageId: string; label: string }[];
}

export interface ChainDto extends ChainSummaryDto {
  document: z.infer<typeof chainDocumentSchema>;
  /** The caller's role in the chain's workspace. */
  role: WorkspaceRole;
  createdAt: string;
}
export interface RevisionSummaryDto {
  id: string;
  /** The chain version this revision saved (1, 2, ...). */
  version: number;
  author: string;
  message: string;
  createdAt: string;
}
export interface RevisionDto extends RevisionSummaryDto {
  document: z.infer<typeof chainDocumentSchema>;
}

// ------------------------------------------------------------------ analysis
/** A mode's id as the API takes it (the chain document's mode ids are slugs). */
const modeIdField = z
  .string({ error: "mode must be the id of one of the chain's modes" })
  .min(1, "mode must be the id of one of the chain's modes")
  .max(40, "mode must be the id of one of the chain's modes (at most 40 characters)");

export const analysisRequestSchema = z.object({
  document: chainDocumentSchema,
  /** Include the frequency sweep in the answer. */
  sweep: z.boolean().default(true),
  /**
   * Add the receiver plan (spurs, strong signals, outside noise, converter): true for the
   * figures, 'full' for the spur chart across the tuning range and the IF choice as well.
   */
  plan: z.union([z.boolean(), z.literal('full')]).default(false),
  /**
   * The sweep traces to send, in columns (`shared/schema/sweep-columns.ts`); default the
   * plotted ones: step-up at every node, input impedance and return loss.
   */
  traces: sweepTracesSchema.optional(),
  /** Send the per-node sweep traces for these node indices only (default: every node). */
  nodes: z.array(z.number().int().min(0).max(1000)).max(200).optional(),
  /** The workspace whose data files the document's stages refer to (`dataFileId`). */
  workspaceId: z.uuid({ error: 'workspaceId must be a workspace id' }).optional(),
  /** Analyse the chain in this mode (absent: its first mode, or as written without modes). */
  mode: modeIdField.optional(),
  /** Analyse every mode: the answer is a `ModesAnalysisDto` (`mode` is then ignored). */
  allModes: z.boolean().default(false),
});

/** One mode's analysis in an every-mode answer: its result, or why it was refused. */
export type ModeAnalysisDto = {
  /** null: a chain without modes, analysed as written. */
  id: string | null;
  name: string;
  kind: 'receive' | 'transmit' | 'state';
} & ({ ok: true; result: AnalysisDto } | { ok: false; message: string; issues: unknown[] });

/** POST /api/analysis with `allModes`, GET /api/chains/:id/analysis?modes=all. */
export interface ModesAnalysisDto {
  modes: ModeAnalysisDto[];
}

// ------------------------------------------------------------------ data files
/** The kinds of data file: one-port and two-port Touchstone. */
export const DATA_FILE_KINDS = ['s1p', 's2p'] as const;
export type DataFileKind = (typeof DATA_FILE_KINDS)[number];

/** POST /api/workspaces/:wid/files: a Touchstone file as text (JSON, no multipart). */
export const uploadDataFileSchema = z.object({
  name: z
    .string()
    .trim()
    .min(1, 'give the file a name, e.g. "loop-antenna.s1p"')
    .max(200, 'the file name can have at most 200 characters'),
  content: z.string().min(1, 'the file is empty; choose a Touchstone file with data lines'),
});

/** A data file in the workspace's list (without its text). */
export interface DataFileSummaryDto {
  id: string;
  name: string;
  kind: DataFileKind;
  portCount: number;
  pointCount: number;
  fMinHz: number;
  fMaxHz: number;
  uploadedBy: string;
  createdAt: string;
}

/** One data file with its text. */
export interface DataFileDto extends DataFileSummaryDto {
  content: string;
}

// ------------------------------------------------------------------ exports
/** What a chain can be exported as: its chain file, an ngspice netlist, Touchstone 1.1. */
export const EXPORT_FORMATS = ['json', 'spice', 'touchstone'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

const exportFormat = z.enum(EXPORT_FORMATS, {
  error: 'format must be one of json, spice, touchstone',
});
const Z0_MESSAGE = 'the reference resistance z0 must be a number of ohms above 0';
/** Touchstone specification versions a chain can be exported in. */
export const TOUCHSTONE_VERSIONS = ['1.1', '2.0'] as const;
export type TouchstoneVersion = (typeof TOUCHSTONE_VERSIONS)[number];
// "2" and "1" are the short forms a query string is likely to carry.
const touchstoneVersion = z
  .enum(['1.1', '2.0', '1', '2'], {
    error: 'version must be 1.1 or 2.0 (the Touchstone specification of the file)',
  })
  .transform((v): TouchstoneVersion => (v.startsWith('2') ? '2.0' : '1.1'));

/** POST /api/export: the document as it is on screen, unsaved edits included. */
export const exportRequestSchema = z.object({
  document: chainDocumentSchema,
  format: exportFormat,
  /** Reference resistance of both Touchstone ports, ohm (default 50; other formats ignore it). */
  z0: z.number(Z0_MESSAGE).positive(Z0_MESSAGE).optional(),
  /** Touchstone version (default 1.1; 2.0 adds `[Reference]` and `[Noise Data]`). */
  version: touchstoneVersion.optional(),
  /** The workspace whose data files the document's stages refer to (`dataFileId`). */
  workspaceId: z.uuid({ error: 'workspaceId must be a workspace id' }).optional(),
  /** Export the chain in this mode (named in the file name and header; absent: first mode). */
  mode: modeIdField.optional(),
});
export type ExportRequest = z.input<typeof exportRequestSchema>;

/** GET /api/chains/:id/export?format=…&z0=…&version=…&mode=… */
export const exportQuerySchema = z.object({
  format: exportFormat,
  z0: z.coerce.number(Z0_MESSAGE).positive(Z0_MESSAGE).optional(),
  version: touchstoneVersion.optional(),
  mode: modeIdField.optional(),
});

export interface ExampleDto {
  key: string;
  name: string;
  description: string;
}

export interface ApiErrorDto {
  error: string;
  message: string;
  details?: unknown;
}

// ------------------------------------------------------------------ design assistants
export * from './design-api';

// ------------------------------------------------------------------ mail
/** Whether a mail an action caused went out; a failure keeps the action and retries the mail. */
export interface MailOutcomeDto {
  sent: boolean;
  /** The message's row in the outbox (for the admin's retry). */
  outboxId: string;
  /** Set when it did not go: what happened and what happens next. */
  message?: string;
}
/** GET /api/admin/mailbox: the local mail catcher's messages (development only). */
export interface CaughtMailSummaryDto {
  id: string;
  to: string;
  subject: string;
  date: string;
}
export interface CaughtMailDto extends CaughtMailSummaryDto {
  from: string;
  text: string;
  html: string | null;
}
/** GET /api/admin/outbox: messages that have not gone out (yet). */
export interface OutboxMessageDto {
  id: string;
  recipient: string;
  subject: string;
  state: 'pending' | 'sent' | 'failed';
  attempts: number;
  lastError: string | null;
  nextAttemptAt: string | null;
  createdAt: string;
}

// ------------------------------------------------------------------ invitations, passwords
export const invitationSchema = z.object({ email, role: z.enum(ROLES) });
/** An invitation as its workspace's owners see it. */
export interface InvitationDto {
  id: string;
  email: string;
  role: WorkspaceRole;
  invitedBy: string;
  createdAt: string;
  expiresAt: string;
  /** Set on the answer to POST: whether the invitation mail went out. */
  mail?: MailOutcomeDto;
}
/** GET /api/invitations/:token: what the link offers, for the person holding it. */
export interface InvitationPreviewDto {
  workspaceName: string;
  role: WorkspaceRole;
  email: string;
  invitedBy: string;
  expiresAt: string;
  /** Whether accepting needs a new account (name and password) or the existing one's password. */
  hasAccount: boolean;
}
/** POST /api/invitations/:token/accept: nothing when signed in as the invited address. */
export const acceptInvitationSchema = z.object({
  displayName: z.string().trim().min(1, 'enter a display name').max(80).optional(),
  password: z.string().min(1).max(200).optional(),
});
export interface AcceptedInvitationDto extends SignedInDto {
  workspaceId: string;
  role: WorkspaceRole;
}
export const passwordResetRequestSchema = z.object({ email });
export const passwordResetSchema = z.object({ password });
/** POST /api/auth/register answers 202 with this when the address must be confirmed first. */
export interface RegistrationPendingDto {
  pending: true;
  message: string;
}

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

// ---- Parts bin: a workspace's inductors and capacitors ----

const partFieldKeys = ['partNumber', 'kind', 'value', 'q', 'qFreq', 'tolerance', 'notes'] as const;

/** Column index per part field, chosen in the upload preview. */
export const partsMappingSchema = z.partialRecord(
  z.enum(partFieldKeys),
  z.number().int().min(0).max(200),
);

/**
 * Body of POST /api/workspaces/:wid/parts/preview and …/parts/import: the CSV's text and,
 * optionally, which column holds which field (absent: guessed from the header names).
 */
export const partsUploadSchema = z.object({
  text: z.string({ error: 'send the CSV\'s content as "text"' }),
  mapping: partsMappingSchema.optional(),
  /** Import only: replace the workspace's whole bin instead of adding to it. */
  replace: z.boolean().optional(),
});
export type PartsUploadBody = z.infer<typeof partsUploadSchema>;

/** One part in a workspace's bin. */
export interface PartDto {
  id: string;
  partNumber: string;
  kind: 'inductor' | 'capacitor';
  /** Henry or farad. */
  value: number;
  q: number | null;
  qFreqHz: number | null;
  tolerancePct: number | null;
  notes: string;
}

/** The upload preview: the columns, the mapping used, and the parts as they would be read. */
export interface PartsPreviewDto {
  headers: string[];
  mapping: Partial<Record<(typeof partFieldKeys)[number], number>>;
  parts: (Omit<PartDto, 'id'> & { line: number })[];
  /** The first line that cannot be read with this mapping (then `parts` is empty). */
  problem?: { line: number; message: string };
}

/** Answer of an import: how many parts were added and the bin now. */
export interface PartsImportDto {
  added: number;
  parts: PartDto[];
}
