/**
 * Chain-file import: the exported `.chain.json` read with the shared reader, its data-file
 * references kept only where this workspace holds the file, saved as a new chain.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { ChainImportDto, ImportChainBody, WorkspaceRole } from '../../shared/schema/api';
import type { ChainDocument } from '../../shared/schema/chain';
import { ChainFileError, readChainFile } from '../../shared/io/chain-file';
import { HttpError } from '../common/errors';
import { DataFileSchema } from '../files/data-file.entity';
import type { User } from '../users/user.entity';
import type { Workspace } from '../workspaces/workspace.entity';
import { chainChanged } from '../activity/chain-events';
import { createChain } from './chain-store';
import { toChainDto } from './dto';

/** A chain file refused: 413 over the size limit, else 422 with where it went wrong. */
export class ChainFileRefusedError extends HttpError {
  constructor(err: ChainFileError) {
    super(err.kind === 'too-large' ? 413 : 422, `chain-file-${err.kind}`, err.message, {
      line: err.where.line ?? null,
      column: err.where.column ?? null,
      path: err.where.path ?? null,
    });
  }
}

/** Parses a chain file's text, turning the reader's refusal into an HTTP error. */
export function parseChainFile(text: string, fileName?: string): ChainDocument {
  try {
    return readChainFile(text, fileName);
  } catch (err) {
    if (err instanceof ChainFileError) throw new ChainFileRefusedError(err);
    throw err;
  }
}

/** Imports `body` into `workspace` as a new chain by `user`. */
export async function importChain(
  em: EntityManager,
  input: { workspace: Workspace; role: WorkspaceRole; user: User; body: ImportChainBody },
): Promise<ChainImportDto> {
  const { workspace, user, body } = input;
  const parsed = parseChainFile(body.text, body.fileName);
  const { document, detached } = await keepHeldDataFiles(em, parsed, workspace.id);
  const chain = await createChain(em, {
    workspace,
    document,
    user,
    message: body.fileName ? `Imported from ${body.fileName.slice(0, 200)}` : 'Imported',
  });
  await chainChanged(em, { chain, user, kind: 'chain-created' });
  return { chain: toChainDto(chain, input.role), detachedDataFiles: detached };
}

/** Drops data-file references to files this workspace does not hold (a file from elsewhere). */
async function keepHeldDataFiles(em: EntityManager, doc: ChainDocument, workspaceId: string) {
  const ids = [...new Set(doc.stages.flatMap((s) => (s.dataFileId ? [s.dataFileId] : [])))];
  if (ids.length === 0) return { document: doc, detached: [] };
  const valid = ids.filter((id) => UUID.test(id));
  const held = valid.length
    ? await em
        .fork()
        .find(DataFileSchema, { id: { $in: valid }, workspace: workspaceId }, { fields: ['id'] })
    : [];
  const keep = new Set(held.map((f) => f.id));
  const detached: { stageId: string; label: string }[] = [];
  const stages = doc.stages.map((st) => {
    if (!st.dataFileId || keep.has(st.dataFileId)) return st;
    detached.push({ stageId: st.id, label: st.label });
    const { dataFileId: _dropped, ...rest } = st;
    return rest;
  });
  return { document: { ...doc, stages }, detached };
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
