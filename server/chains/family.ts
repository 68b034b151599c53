import type { EntityManager } from '@mikro-orm/postgresql';
import { ChainSchema, type Chain } from './chain.entity';
import { CHAIN_DTO_POPULATE } from './chain.repository';

/** More generations than any real family has; stops a corrupt parent loop. */
const MAX_GENERATIONS = 64;

/**
 * The family of `chain`: its root (the ancestor reached by following `parent` up) first,
 * then every chain whose parent is in the family, generation by generation, oldest first.
 * Only chains of the chain's own workspace take part.
 */
export async function chainFamily(em: EntityManager, chain: Chain): Promise<Chain[]> {
  const workspace = chain.workspace.id;
  let root = await em.findOneOrFail(ChainSchema, chain.id, { populate: CHAIN_DTO_POPULATE });
  const climbed = new Set([root.id]);
  for (let i = 0; i < MAX_GENERATIONS && root.parent; i++) {
    const parent = await em.findOne(
      ChainSchema,
      { id: root.parent.id, workspace },
      { populate: CHAIN_DTO_POPULATE },
    );
    if (!parent || climbed.has(parent.id)) break;
    climbed.add(parent.id);
    root = parent;
  }
  const family: Chain[] = [root];
  const seen = new Set([root.id]);
  let generation = [root.id];
  for (let i = 0; i < MAX_GENERATIONS && generation.length > 0; i++) {
    const children = await em.find(
      ChainSchema,
      { parent: { $in: generation }, workspace, id: { $nin: [...seen] } },
      { populate: CHAIN_DTO_POPULATE, orderBy: [{ createdAt: 'asc' }, { id: 'asc' }] },
    );
    for (const child of children) seen.add(child.id);
    family.push(...children);
    generation = children.map((c) => c.id);
  }
  return family;
}
