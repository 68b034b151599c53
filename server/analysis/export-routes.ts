import { Router, type Response } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import {
  exportQuerySchema,
  exportRequestSchema,
  type ExportFormat,
  type TouchstoneVersion,
} from '../../shared/schema/api';
import type { ChainDocument, Mode } from '../../shared/schema/chain';
import { exportFileName } from '../../shared/io/export-name';
import { storedDocument } from '../chains/stored-document';
import { HttpError } from '../common/errors';
import { chainRole, currentUser, requireUser } from '../common/roles';
import { assertCanRead, loadDataFiles } from '../files/data-files';
import { parseOr422 } from '../common/validate';
import { assertWithinBudget, runOnPool } from './analysis-pool';
import {
  buildExportFile,
  exportNeedsEngine,
  type ExportFile,
  type ExportSpec,
} from './export-file';

/** What an export is asked for beyond the document and its format. */
export interface ExportOptions {
  z0?: number;
  workspaceId?: string;
  modeId?: string;
  version?: TouchstoneVersion;
}

/**
 * The mode an export is of: the one asked for, else (for the engine's formats) the first
 * mode, which is what the engine builds when none is named. The whole chain file of a chain
 * with modes is of no one mode.
 */
function modeOfExport(
  doc: ChainDocument,
  format: ExportFormat,
  modeId: string | undefined,
): Mode | undefined {
  const modes = doc.modes ?? [];
  if (modeId === undefined) return format === 'json' ? undefined : modes[0];
  const mode = modes.find((m) => m.id === modeId);
  if (!mode) {
    const known = modes.map((m) => `"${m.id}"`).join(', ');
    throw new HttpError(
      422,
      'unknown-mode',
      known
        ? `this chain has no mode "${modeId}"; its modes are ${known}`
        : `this chain has no modes, so it cannot be exported in mode "${modeId}"; leave mode out`,
      [{ path: ['mode'], message: `no mode "${modeId}"` }],
    );
  }
  return mode;
}

/**
 * The export's file. Anything that runs the engine runs on the analysis thread pool; a
 * Touchstone file (the cascade at every sweep point) is under the stages × points budget.
 */
async function exportFile(
  em: EntityManager,
  doc: ChainDocument,
  spec: ExportSpec,
  workspaceId: string | undefined,
): Promise<ExportFile> {
  if (!exportNeedsEngine(spec)) return buildExportFile(doc, spec);
  if (spec.format === 'touchstone') assertWithinBudget(doc);
  const dataFiles = await loadDataFiles(em, doc, workspaceId);
  const outcome = await runOnPool({
    document: doc,
    ...(dataFiles ? { dataFiles } : {}),
    want: 'export',
    export: spec,
    traces: [],
  });
  if (outcome.kind === 'refused') {
    throw new HttpError(422, outcome.code ?? 'invalid-chain', outcome.message, outcome.details);
  }
  if (outcome.kind !== 'export') throw new Error(`export thread answered ${outcome.kind}`);
  return outcome.file;
}

export async function sendExport(
  em: EntityManager,
  res: Response,
  doc: ChainDocument,
  format: ExportFormat,
  options: ExportOptions,
): Promise<void> {
  const mode = modeOfExport(doc, format, options.modeId);
  const { z0, version } = options;
  const spec: ExportSpec = {
    format,
    ...(z0 === undefined ? {} : { z0 }),
    ...(version ? { version } : {}),
    ...(mode ? { mode } : {}),
  };
  const file = await exportFile(em, doc, spec, options.workspaceId);
  // A mode's file carries its id: "transceiver_transmit_50ohm.s2p" beside "…_receive_…".
  const name = exportFileName({
    chainName: doc.name,
    mode: mode?.id ?? null,
    referenceOhm: file.referenceOhm,
    content: file.content,
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
    await sendExport(em, res, body.document, body.format, {
      z0: body.z0,
      workspaceId: body.workspaceId,
      modeId: body.mode,
      version: body.version,
    });
  });
  return router;
}

/** GET /api/chains/:id/export?format=…&z0=…&mode=…: the stored chain, for viewers and up. */
export function chainExportRouter(em: EntityManager): Router {
  const router = Router();
  router.get('/:id/export', chainRole(em, 'viewer'), async (req, res) => {
    const query = parseOr422(exportQuerySchema, req.query, 'query');
    const chain = res.locals.chain!;
    await sendExport(em, res, storedDocument(chain.document), query.format, {
      z0: query.z0,
      workspaceId: chain.workspace.id,
      modeId: query.mode,
      version: query.version,
    });
  });
  return router;
}
