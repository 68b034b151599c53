import { Router, type Response } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { exportQuerySchema, exportRequestSchema, type ExportFormat } from '../../shared/schema/api';
import type { ChainDocument } from '../../shared/schema/chain';
import { chainToSpice, SpiceExportError } from '../../shared/engine/spice/netlist';
import { chainToTouchstone, TouchstoneExportError } from '../../shared/io/chain-touchstone';
import { exportFileName } from '../../shared/io/export-name';
import { HttpError } from '../common/errors';
import { chainRole, currentUser, requireUser } from '../common/roles';
import { assertCanRead, loadDataFiles } from '../files/data-files';
import { parseOr422 } from '../common/validate';
import { invalidChainError } from './engine-errors';

/** A stage the asked form cannot express (a mixer in SPICE or Touchstone, an IF block in SPICE). */
class CannotExportError extends HttpError {
  constructor(stageId: string, message: string) {
    super(422, 'cannot-export', message, { stageId });
  }
}

interface ExportFile {
  text: string;
  contentType: string;
  extension: string;
  /** The reference impedance the file's figures are given against, for its name. */
  referenceOhm?: number;
}

async function exportFile(
  em: EntityManager,
  doc: ChainDocument,
  format: ExportFormat,
  z0: number | undefined,
  workspaceId: string | undefined,
): Promise<ExportFile> {
  if (format === 'json') {
    // The chain file needs no engine: it is the document as the schema accepts it, so a
    // chain the engine refuses can still be taken elsewhere and fixed.
    return {
      text: JSON.stringify(doc, null, 2) + '\n',
      contentType: 'application/json; charset=utf-8',
      extension: 'chain.json',
    };
  }
  const dataFiles = await loadDataFiles(em, doc, workspaceId);
  const withFiles = dataFiles ? { dataFiles } : {};
  try {
    return format === 'spice'
      ? {
          text: chainToSpice(doc, withFiles),
          contentType: 'text/plain; charset=utf-8',
          extension: 'cir',
        }
      : {
          text: chainToTouchstone(doc, { z0: z0 ?? 50, ...withFiles }),
          contentType: 'text/plain; charset=utf-8',
          extension: 's2p',
          referenceOhm: z0 ?? 50,
        };
  } catch (err) {
    if (err instanceof SpiceExportError || err instanceof TouchstoneExportError) {
      throw new CannotExportError(err.stageId, err.message);
    }
    throw invalidChainError(err) ?? err;
  }
}

export async function sendExport(
  em: EntityManager,
  res: Response,
  doc: ChainDocument,
  format: ExportFormat,
  z0: number | undefined,
  workspaceId: string | undefined,
): Promise<void> {
  const file = await exportFile(em, doc, format, z0, workspaceId);
  const name = exportFileName({
    chainName: doc.name,
    referenceOhm: file.referenceOhm,
    extension: file.extension,
  });
  res
    .status(200)
    .set('Content-Type', file.contentType)
    // The name is plain ASCII without quotes, so the quoted form needs no escaping.
    .set('Content-Disposition', `attachment; filename="${name}"`)
    .set('Cache-Control', 'no-store')
    .send(file.text);
}

/** POST /api/export: any signed-in user, for the document they send. */
export function exportRouter(em: EntityManager): Router {
  const router = Router();
  router.post('/export', requireUser, async (req, res) => {
    const body = parseOr422(exportRequestSchema, req.body);
    if (body.workspaceId) await assertCanRead(em, currentUser(req), body.workspaceId);
    await sendExport(em, res, body.document, body.format, body.z0, body.workspaceId);
  });
  return router;
}

/** GET /api/chains/:id/export?format=…&z0=…: the stored chain, for viewers and up. */
export function chainExportRouter(em: EntityManager): Router {
  const router = Router();
  router.get('/:id/export', chainRole(em, 'viewer'), async (req, res) => {
    const query = parseOr422(exportQuerySchema, req.query, 'query');
    const chain = res.locals.chain!;
    await sendExport(em, res, chain.document, query.format, query.z0, chain.workspace.id);
  });
  return router;
}
