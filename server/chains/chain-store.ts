import type { EntityManager } from '@mikro-orm/postgresql';
import type { ChainDocument } from '../../shared/schema/chain';
import { countFlags } from '../analysis/flag-count';
import { ConflictError } from '../common/errors';
import { lockReferencedDataFiles } from '../files/data-file-lock';
import type { User } from '../users/user.entity';
import type { Workspace } from '../workspaces/workspace.entity';
import { ChainSchema, type Chain } from './chain.entity';
import { CHAIN_DTO_POPULATE } from './chain.repository';
import { ChainRevisionSchema } from './revision.entity';

/** The columns copied from the document, for listing, search and sort. */
function documentColumns(doc: ChainDocument) {
  return {
    name: doc.name,
    description: doc.description,
    f0Hz: doc.settings.f0Hz,
    stageCount: doc.stages.length,
  };
}

/** Creates a chain at version 1 with its first revision. */
export async function createChain(
  em: EntityManager,
  input: {
    workspace: Workspace;
    document: ChainDocument;
    user: User;
    message: string;
    parent?: Chain | null;
  },
): Promise<Chain> {
  const flagCount = await countFlags(em, input.document, input.workspace.id);
  const chain = em.create(ChainSchema, {
    workspace: input.workspace,
    ...documentColumns(input.document),
    flagCount,
    document: input.document,
    version: 1,
    parent: input.parent ?? null,
    createdBy: input.user,
    updatedBy: input.user,
  });
  em.create(ChainRevisionSchema, {
    chain,
    version: 1,
    document: input.document,
    author: input.user,
    message: input.message,
  });
  // One transaction with the data-file locks, so a file cannot be deleted under the save.
  await em.begin();
  try {
    await lockReferencedDataFiles(em, input.document);
    await em.commit();
  } catch (err) {
    // The first error says what went wrong; a rollback on a lost connection fails too, and
    // its error would hide it.
    await em.rollback().catch(() => undefined);
    throw err;
  }
  return chain;
}

function staleError(currentVersion: number, sent: number): ConflictError {
  return new ConflictError(
    'stale-version',
    `this chain was saved as version ${currentVersion} since you loaded version ${sent}; ` +
      'reload it (or copy your changes into a duplicate) and save again',
    { currentVersion },
  );
}

/**
 * Saves a new version of `chain` if its stored version is still `expectedVersion`, and
 * writes the matching revision, in one transaction. A stale version gives 409 with
 * `{ currentVersion }` and writes nothing. The conditional UPDATE (not only the check
 * before it) decides, so two saves racing from the same version cannot both win.
 */
export async function saveChainVersion(
  em: EntityManager,
  chain: Chain,
  input: { expectedVersion: number; document: ChainDocument; user: User; message: string },
): Promise<Chain> {
  if (chain.version !== input.expectedVersion)
    throw staleError(chain.version, input.expectedVersion);
  const flagCount = await countFlags(em, input.document, chain.workspace.id);
  const next = input.expectedVersion + 1;
  await em.transactional(async (tem) => {
    await lockReferencedDataFiles(tem, input.document);
    const updated = await tem.nativeUpdate(
      ChainSchema,
      { id: chain.id, version: input.expectedVersion },
      {
        ...documentColumns(input.document),
        flagCount,
        document: input.document,
        version: next,
        updatedBy: input.user.id,
        updatedAt: new Date(),
      },
    );
    if (updated === 0) {
      const current = await tem.findOneOrFail(ChainSchema, chain.id, {
        fields: ['version'],
        refresh: true,
      });
      throw staleError(current.version, input.expectedVersion);
    }
    tem.create(ChainRevisionSchema, {
      chain: chain.id,
      version: next,
      document: input.document,
      author: input.user.id,
      message: input.message,
    });
  });
  return em.findOneOrFail(ChainSchema, chain.id, { refresh: true, populate: CHAIN_DTO_POPULATE });
}
