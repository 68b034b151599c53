import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import {
  createChainSchema,
  duplicateChainSchema,
  importChainSchema,
  listChainsQuerySchema,
  updateChainSchema,
  type ChainListDto,
} from '../../shared/schema/api';
import type { ChainDocument } from '../../shared/schema/chain';
import { access, chainRole, currentUser, requireUser, workspaceRole } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { createChain, saveChainVersion } from './chain-store';
import { ChainSchema } from './chain.entity';
import { CHAIN_DTO_POPULATE, chainsOf } from './chain.repository';
import { toChainDto, toChainSummaryDto } from './dto';
import { chainFamily } from './family';
import { readExample, readExamples, toExampleDto } from './examples';
import { revisionRoutes } from './revision-routes';
import { chainChanged } from '../activity/chain-events';
import { importChain } from './import';

/** /api/workspaces/:wid/chains: list (search, page, sort) and create. */
export function workspaceChainsRouter(em: EntityManager, examplesDir: string): Router {
  const router = Router();

  router.get('/:wid/chains', workspaceRole(em, 'viewer'), async (req, res) => {
    const query = parseOr422(listChainsQuerySchema, req.query, 'query');
    const chains = chainsOf(em);
    const workspaceId = access(res).workspace.id;
    const [items, total] = await chains.search(workspaceId, query);
    const variants = await chains.variantCounts(
      workspaceId,
      items.map((c) => c.id),
    );
    const body: ChainListDto = {
      items: items.map((c) => ({ ...toChainSummaryDto(c), variantCount: variants.get(c.id) ?? 0 })),
      total,
      page: query.page,
      pageSize: query.pageSize,
    };
    res.json(body);
  });

  router.post('/:wid/chains', workspaceRole(em, 'editor'), async (req, res) => {
    const body = parseOr422(createChainSchema, req.body);
    const { workspace, role } = access(res);
    let document: ChainDocument;
    let message = body.message;
    if (body.document) {
      document = body.document;
    } else {
      document = (await readExample(examplesDir, body.fromExample!)).document;
      message ??= `Created from example ${body.fromExample}`;
    }
    if (body.name) document = { ...document, name: body.name };
    const chain = await createChain(em, {
      workspace,
      document,
      user: currentUser(req),
      message: message ?? 'Created',
    });
    await chainChanged(em, { chain, user: currentUser(req), kind: 'chain-created' });
    res.status(201).json(toChainDto(chain, role));
  });

  router.post('/:wid/chains/import', workspaceRole(em, 'editor'), async (req, res) => {
    const body = parseOr422(importChainSchema, req.body);
    const { workspace, role } = access(res);
    res.status(201).json(await importChain(em, { workspace, role, user: currentUser(req), body }));
  });

  return router;
}

/** /api/examples: the example chains new chains can start from. */
export function examplesRouter(examplesDir: string): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (_req, res) => {
    res.json((await readExamples(examplesDir)).map(toExampleDto));
  });
  return router;
}

/** /api/chains/:id: read, save, delete, duplicate, its family, and the revision history. */
export function chainsRouter(em: EntityManager): Router {
  const router = Router();

  router.get('/:id', chainRole(em, 'viewer'), async (_req, res) => {
    const chain = await em.findOneOrFail(ChainSchema, res.locals.chain!.id, {
      populate: CHAIN_DTO_POPULATE,
    });
    res.json(toChainDto(chain, access(res).role));
  });

  // The chain's root and every variant below it, root first: what a comparison offers.
  router.get('/:id/family', chainRole(em, 'viewer'), async (_req, res) => {
    const family = await chainFamily(em, res.locals.chain!);
    res.json(family.map(toChainSummaryDto));
  });

  router.put('/:id', chainRole(em, 'editor'), async (req, res) => {
    const body = parseOr422(updateChainSchema, req.body);
    const saved = await saveChainVersion(em, res.locals.chain!, {
      expectedVersion: body.version,
      document: body.document,
      user: currentUser(req),
      message: body.message ?? '',
    });
    await chainChanged(em, { chain: saved, user: currentUser(req), kind: 'chain-saved' });
    res.json(toChainDto(saved, access(res).role));
  });

  router.delete('/:id', chainRole(em, 'editor'), async (req, res) => {
    const chain = res.locals.chain!;
    const workspaceId = chain.workspace.id;
    await em.remove(chain).flush();
    await chainChanged(em, { chain, user: currentUser(req), kind: 'chain-deleted', workspaceId });
    res.status(204).end();
  });

  router.post('/:id/duplicate', chainRole(em, 'editor'), async (req, res) => {
    const body = parseOr422(duplicateChainSchema, req.body ?? {});
    const source = res.locals.chain!;
    const name = body.name ?? `${source.name} (${body.asVariant ? 'variant' : 'copy'})`;
    const document = { ...(body.document ?? source.document), name };
    const copy = await createChain(em, {
      workspace: source.workspace,
      document,
      user: currentUser(req),
      message: `${body.asVariant ? 'Variant' : 'Copy'} of "${source.name}" version ${source.version}`,
      parent: body.asVariant ? source : null,
    });
    await chainChanged(em, { chain: copy, user: currentUser(req), kind: 'chain-created' });
    res.status(201).json(toChainDto(copy, access(res).role));
  });

  router.use('/:id/revisions', revisionRoutes(em));
  return router;
}
