import type { EntityManager } from '@mikro-orm/postgresql';
import { LRUCache } from 'lru-cache';
import type { MeasuredNetwork } from '../../shared/engine/types';
import { toMeasuredNetwork } from '../../shared/io/network-data';
import { readTouchstone, TouchstoneError, type TouchstoneFile } from '../../shared/io/touchstone';
import type { DataFileDto, DataFileKind, DataFileSummaryDto } from '../../shared/schema/api';
import type { ChainDocument } from '../../shared/schema/chain';
import { HttpError } from '../common/errors';
import { assertCanReadInOneQuery } from '../common/one-query-access';
import type { User } from '../users/user.entity';
import { DataFileSchema, type DataFile } from './data-file.entity';

/** A Touchstone file the reader refuses: 422 with the reader's message (file, line, fix). */
export class InvalidDataFileError extends HttpError {
  constructor(err: TouchstoneError) {
    super(422, 'invalid-data-file', err.message, { line: err.line ?? null });
  }
}

/** A stage that refers to a data file the chain's workspace cannot supply. */
export class MissingDataFileError extends HttpError {
  constructor(message: string, stageId: string) {
    super(422, 'missing-data-file', message, { stageId });
  }
}

/** Parses Touchstone text, turning the reader's refusal into a 422. */
export function parseDataFile(content: string, name: string): TouchstoneFile {
  try {
    return readTouchstone(content, name);
  } catch (err) {
    if (err instanceof TouchstoneError) throw new InvalidDataFileError(err);
    throw err;
  }
}

/** The kind from the name's extension, else from the port count the reader found. */
export function dataFileKind(name: string, ports: 1 | 2): DataFileKind {
  const ext = /\.(s[12]p)$/i.exec(name)?.[1]?.toLowerCase();
  if (ext === 's1p' || ext === 's2p') return ext;
  return ports === 1 ? 's1p' : 's2p';
}

/** The list form of a data file. */
export function toDataFileSummaryDto(file: Omit<DataFile, 'content'>): DataFileSummaryDto {
  return {
    id: file.id,
    name: file.name,
    kind: file.kind,
    portCount: file.portCount,
    pointCount: file.pointCount,
    fMinHz: file.fMinHz,
    fMaxHz: file.fMaxHz,
    uploadedBy: file.uploadedBy.displayName,
    createdAt: file.createdAt.toISOString(),
  };
}

/** A data file with its text. */
export function toDataFileDto(file: DataFile): DataFileDto {
  return { ...toDataFileSummaryDto(file), content: file.content };
}

/** The stages of `doc` that refer to a data file. */
function stagesWithFiles(doc: ChainDocument) {
  return doc.stages.flatMap((st, index) =>
    st.dataFileId ? [{ id: st.id, index, label: st.label, fileId: st.dataFileId }] : [],
  );
}

function stageTitle(st: { index: number; label: string; id: string }): string {
  return `stage ${st.index + 1} (${st.label || st.id})`;
}

/**
 * The parsed data files the stages of `doc` refer to, loaded from `workspaceId` only, or
 * undefined when no stage refers to one. A file missing from the workspace is left out, so
 * the engine reports it as an issue naming the stage. Without a workspace, a stage with a
 * file is a 422 that says to send the workspace.
 */
export async function loadDataFiles(
  em: EntityManager,
  doc: ChainDocument,
  workspaceId: string | undefined,
): Promise<Record<string, MeasuredNetwork> | undefined> {
  const stages = stagesWithFiles(doc);
  if (stages.length === 0) return undefined;
  if (!workspaceId) {
    throw new MissingDataFileError(
      `${stageTitle(stages[0])} refers to a data file, but no workspace was given; ` +
        'send the workspaceId of the workspace that holds the file',
      stages[0].id,
    );
  }
  const ids = [...new Set(stages.map((s) => s.fileId))].filter((id) => UUID.test(id));
  if (ids.length === 0) return {};
  // The live editor analyses on every edit: ask only which of the files this workspace
  // holds (a fork, so no half-loaded entity lands in the request's identity map), and read
  // and parse a file's text once — files are never changed after upload.
  const held = await em
    .fork()
    .find(DataFileSchema, { id: { $in: ids }, workspace: workspaceId }, { fields: ['id'] });
  const out: Record<string, MeasuredNetwork> = {};
  const unparsed: string[] = [];
  for (const { id } of held) {
    const cached = PARSED.get(id);
    if (cached) out[id] = cached;
    else unparsed.push(id);
  }
  if (unparsed.length > 0) {
    for (const file of await em.find(DataFileSchema, { id: { $in: unparsed } })) {
      out[file.id] = toMeasuredNetwork(parseDataFile(file.content, file.name));
      PARSED.set(file.id, out[file.id]);
    }
  }
  return out;
}

/** Parsed files by id, least recently used dropped first; bounded so memory stays small. */
const PARSED = new LRUCache<string, MeasuredNetwork>({ max: 64 });

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * Checks that `user` may read workspace `workspaceId` (viewer and up), for routes that take
 * the workspace in the body: 404 for no such workspace, 403 for a non-member. One query
 * (../common/one-query-access.ts): an analysis asks this many times a second.
 */
export function assertCanRead(em: EntityManager, user: User, workspaceId: string): Promise<void> {
  return assertCanReadInOneQuery(em, user, workspaceId);
}
