import { LockMode } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { ChainDocument } from '../../shared/schema/chain';
import { DataFileSchema } from './data-file.entity';
import { MissingDataFileError } from './data-files';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * Inside the transaction that saves `doc`: takes a share lock on every data file its stages
 * refer to, and refuses (422, naming the stage) a reference to a file that does not exist.
 * Deleting a file takes the row's update lock before it looks for chains using it, so a
 * save and a delete of the same file are ordered: either the delete sees the saved chain
 * and refuses, or the save finds the file gone. No chain is left pointing at a deleted file.
 */
export async function lockReferencedDataFiles(
  em: EntityManager,
  doc: ChainDocument,
): Promise<void> {
  const stages = doc.stages.flatMap((st, index) =>
    st.dataFileId ? [{ id: st.id, label: st.label, index, fileId: st.dataFileId }] : [],
  );
  if (stages.length === 0) return;
  const ids = [...new Set(stages.map((s) => s.fileId))].filter((id) => UUID.test(id)).sort();
  const rows = ids.length
    ? await em
        .createQueryBuilder(DataFileSchema)
        .select('id')
        .where({ id: { $in: ids } })
        .setLockMode(LockMode.PESSIMISTIC_READ)
        .execute('all', false)
    : [];
  const found = new Set(rows.map((r) => String((r as { id: string }).id)));
  const missing = stages.find((s) => !found.has(s.fileId));
  if (missing) {
    throw new MissingDataFileError(
      `stage ${missing.index + 1} (${missing.label || missing.id}) refers to a data file that ` +
        'does not exist (it may just have been deleted); choose another file or detach it',
      missing.id,
    );
  }
}

/**
 * Inside the transaction that deletes a data file: loads it with the row's update lock, so
 * saves that refer to it wait (or have committed) before the caller looks for chains using
 * it. Null when there is no such file in the workspace.
 */
export async function lockDataFileForDelete(
  em: EntityManager,
  fileId: string,
  workspaceId: string,
): Promise<{ id: string; name: string } | null> {
  const rows = await em
    .createQueryBuilder(DataFileSchema)
    .select(['id', 'name'])
    .where({ id: fileId, workspace: workspaceId })
    .setLockMode(LockMode.PESSIMISTIC_WRITE)
    .execute('all', false);
  const row = rows[0] as { id: string; name: string } | undefined;
  return row ? { id: row.id, name: row.name } : null;
}
