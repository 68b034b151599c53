import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { uploadDataFileSchema } from '../../shared/schema/api';
import type { ChainDocument } from '../../shared/schema/chain';
import { ChainSchema } from '../chains/chain.entity';
import { ConflictError, NotFoundError } from '../common/errors';
import { access, currentUser, uuidParam, workspaceRole } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { lockDataFileForDelete } from './data-file-lock';
import { DataFileSchema } from './data-file.entity';
import { dataFileKind, parseDataFile, toDataFileDto, toDataFileSummaryDto } from './data-files';

/** /api/workspaces/:wid/files: the workspace's measured data files (Touchstone text). */
export function dataFilesRouter(em: EntityManager): Router {
  const router = Router();

  router.get('/:wid/files', workspaceRole(em, 'viewer'), async (_req, res) => {
    const files = await em.find(
      DataFileSchema,
      { workspace: access(res).workspace.id },
      {
        populate: ['uploadedBy'],
        exclude: ['content'],
        orderBy: { name: 'asc', createdAt: 'asc' },
      },
    );
    res.json(files.map(toDataFileSummaryDto));
  });

  router.post('/:wid/files', workspaceRole(em, 'editor'), async (req, res) => {
    const body = parseOr422(uploadDataFileSchema, req.body);
    const parsed = parseDataFile(body.content, body.name);
    const n = parsed.freqsHz.length;
    const file = em.create(DataFileSchema, {
      workspace: access(res).workspace,
      name: body.name,
      kind: dataFileKind(body.name, parsed.ports),
      content: body.content,
      portCount: parsed.ports,
      pointCount: n,
      fMinHz: parsed.freqsHz[0],
      fMaxHz: parsed.freqsHz[n - 1],
      uploadedBy: currentUser(req),
    });
    await em.flush();
    res.status(201).json(toDataFileDto(file));
  });

  router.get('/:wid/files/:fileId', workspaceRole(em, 'viewer'), async (req, res) => {
    const file = await em.findOne(
      DataFileSchema,
      { id: uuidParam(req, 'fileId', 'data file'), workspace: access(res).workspace.id },
      { populate: ['uploadedBy'] },
    );
    if (!file) throw new NotFoundError('no such data file in this workspace');
    res.json(toDataFileDto(file));
  });

  router.delete('/:wid/files/:fileId', workspaceRole(em, 'editor'), async (req, res) => {
    const workspaceId = access(res).workspace.id;
    const fileId = uuidParam(req, 'fileId', 'data file');
    // The check for chains using the file and the delete are one transaction that holds
    // the file's row lock, so a chain saved meanwhile is either seen here or refused.
    await em.transactional(async (tem) => {
      const file = await lockDataFileForDelete(tem, fileId, workspaceId);
      if (!file) throw new NotFoundError('no such data file in this workspace');
      const chains = await tem.find(
        ChainSchema,
        { workspace: workspaceId },
        { fields: ['name', 'document'], orderBy: { name: 'asc' } },
      );
      const users = chains.filter((c) => refersTo(c.document, file.id));
      if (users.length > 0) {
        const names = users.map((c) => `"${c.name}"`).join(', ');
        throw new ConflictError(
          'data-file-in-use',
          `${file.name} is used by the chain ${names}; detach it from the stages there first`,
          { chains: users.map((c) => ({ id: c.id, name: c.name })) },
        );
      }
      await tem.nativeDelete(DataFileSchema, { id: file.id });
    });
    res.status(204).end();
  });

  return router;
}

function refersTo(doc: ChainDocument, fileId: string): boolean {
  return doc.stages.some((st) => st.dataFileId === fileId);
}
