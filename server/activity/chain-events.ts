import type { EntityManager } from '@mikro-orm/postgresql';
import type { Chain } from '../chains/chain.entity';
import { publishChainEvent } from '../presence/event-hub';
import type { User } from '../users/user.entity';
import { recordActivity } from './record';

type ChainChange = 'chain-created' | 'chain-saved' | 'chain-restored' | 'chain-deleted';

const WORDS: Record<ChainChange, (c: Chain) => string> = {
  'chain-created': (c) => `created "${c.name}"`,
  'chain-saved': (c) => `saved "${c.name}" as version ${c.version}`,
  'chain-restored': (c) => `restored an earlier revision of "${c.name}" as version ${c.version}`,
  'chain-deleted': (c) => `deleted "${c.name}"`,
};

/**
 * After a chain was stored: the workspace's activity gets an entry, and everyone with the
 * chain open (in any server process) hears of a new version at once.
 */
export async function chainChanged(
  em: EntityManager,
  change: { chain: Chain; user: User; kind: ChainChange; workspaceId?: string },
): Promise<void> {
  const { chain, user, kind } = change;
  recordActivity(em, {
    workspaceId: change.workspaceId ?? chain.workspace.id,
    actor: user,
    kind,
    summary: WORDS[kind](chain),
    chainId: chain.id,
  });
  await em.flush();
  if (kind === 'chain-saved' || kind === 'chain-restored') {
    await publishChainEvent(em, {
      type: 'saved',
      chainId: chain.id,
      version: chain.version,
      by: user.displayName,
      byUserId: user.id,
    });
  }
}
