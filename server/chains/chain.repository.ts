import { EntityRepository, type EntityManager, type FilterQuery } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import type { listChainsQuerySchema } from '../../shared/schema/api';
import { ChainSchema, type Chain } from './chain.entity';

/** Relations a ChainDto needs. */
export const CHAIN_DTO_POPULATE = ['createdBy', 'updatedBy'] as const;

/** Escapes LIKE wildcards so a search for "50%" finds the text "50%". */
export const likeEscape = (s: string) => s.replace(/[\\%_]/g, (c) => '\\' + c);

/** Queries over chains. */
export class ChainRepository extends EntityRepository<Chain> {
  /**
   * One page of a workspace's chains: `q` matches name or description without regard to
   * case; the id breaks sort ties so pages never overlap or skip rows.
   */
  /**
   * How many chains of the workspace name each of `ids` as their parent (ids without
   * variants are left out).
   */
  async variantCounts(workspaceId: string, ids: string[]): Promise<Map<string, number>> {
    const counts = new Map<string, number>();
    if (ids.length === 0) return counts;
    const variants = await this.find(
      { parent: { $in: ids }, workspace: workspaceId },
      { fields: ['parent'] },
    );
    for (const v of variants) {
      if (v.parent) counts.set(v.parent.id, (counts.get(v.parent.id) ?? 0) + 1);
    }
    return counts;
  }

  search(workspaceId: string, query: z.infer<typeof listChainsQuerySchema>) {
    const where: FilterQuery<Chain> = { workspace: workspaceId };
    const q = query.q?.trim();
    if (q) {
      const pattern = `%${likeEscape(q)}%`;
      where.$or = [{ name: { $ilike: pattern } }, { description: { $ilike: pattern } }];
    }
    return this.findAndCount(where, {
      populate: CHAIN_DTO_POPULATE,
      orderBy: [{ [query.sort]: query.dir }, { id: 'asc' }],
      limit: query.pageSize,
      offset: query.page * query.pageSize,
    });
  }
}

/** The chain repository of `em` (its request context when inside one). */
export function chainsOf(em: EntityManager): ChainRepository {
  return em.getRepository<Chain, ChainRepository>(ChainSchema);
}
