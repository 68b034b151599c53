import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { partsUploadSchema, type PartsImportDto } from '../../shared/schema/api';
import { NotFoundError } from '../common/errors';
import { access, currentUser, uuidParam, workspaceRole } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { PartSchema } from './part.entity';
import { previewUpload, readUpload, toPartDto } from './parts';

/**
 * /api/workspaces/:wid/parts: the workspace's parts bin. Members read it; editors preview
 * an upload (nothing stored), import it (add to the bin or replace it) and delete parts.
 */
export function partsRouter(em: EntityManager): Router {
  const router = Router();
  const list = async (workspaceId: string) =>
    (
      await em.find(
        PartSchema,
        { workspace: workspaceId },
        { orderBy: { kind: 'asc', value: 'asc', partNumber: 'asc' } },
      )
    ).map(toPartDto);

  router.get('/:wid/parts', workspaceRole(em, 'viewer'), async (_req, res) => {
    res.json(await list(access(res).workspace.id));
  });

  router.post('/:wid/parts/preview', workspaceRole(em, 'editor'), (req, res) => {
    res.json(previewUpload(parseOr422(partsUploadSchema, req.body)));
  });

  router.post('/:wid/parts/import', workspaceRole(em, 'editor'), async (req, res) => {
    const body = parseOr422(partsUploadSchema, req.body);
    const { rows } = readUpload(body);
    const workspace = access(res).workspace;
    await em.transactional(async (tem) => {
      if (body.replace) await tem.nativeDelete(PartSchema, { workspace: workspace.id });
      for (const r of rows) {
        tem.create(PartSchema, {
          workspace,
          partNumber: r.partNumber,
          kind: r.kind,
          value: r.value,
          q: r.q ?? null,
          qFreqHz: r.qFreqHz ?? null,
          tolerancePct: r.tolerancePct ?? null,
          notes: r.notes,
          sourceLine: r.line,
          uploadedBy: currentUser(req),
        });
      }
    });
    const body201: PartsImportDto = { added: rows.length, parts: await list(workspace.id) };
    res.status(201).json(body201);
  });

  router.delete('/:wid/parts/:partId', workspaceRole(em, 'editor'), async (req, res) => {
    const deleted = await em.nativeDelete(PartSchema, {
      id: uuidParam(req, 'partId', 'part'),
      workspace: access(res).workspace.id,
    });
    if (deleted === 0) throw new NotFoundError('no such part in this workspace');
    res.status(204).end();
  });

  return router;
}
