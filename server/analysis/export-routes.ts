import { Router, type Response } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import {
  exportQuerySchema,
  exportRequestSchema,
  type ExportFormat,
  type TouchstoneVersion,
} from '../../shared/schema/api';
import type { ChainDocument, Mode } from '../../shared/schema/chain';
import { chainInMode } from '../../shared/engine';
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
  /** What the name says the file holds beyond its kind ('v2' for a Touchstone 2.0 file). */
  content?: string;
}

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

/** The line naming the mode at the top of a netlist or Touchstone file. */
function modeLine(comment: '*' | '!', mode: Mode): string {
  return `${comment} Mode "${mode.name.replace(/[\r\n]+/g, ' ')}" (${mode.kind}, id ${mode.id})`;
}

/** A 2.0 file must open with its `[Version]` line: the mode's comment goes after it. */
function withModeLine(touchstone: string, line: string): string {
  const [first, ...rest] = touchstone.split('\n');
  return first.startsWith('[Version]')
    ? [first, line, ...rest].join('\n')
    : `${line}\n${touchstone}`;
}

async function exportFile(
  em: EntityManager,
  doc: ChainDocument,
  format: ExportFormat,
  options: ExportOptions,
  mode: Mode | undefined,
): Promise<ExportFile> {
  const { z0, workspaceId, version } = options;
  const dataFiles = format === 'json' && !mode ? undefined : await loadDataFiles(em, doc, workspaceId); // prettier-ignore
  const withFiles = dataFiles ? { dataFiles } : {};
  try {
    // In a mode, the chain as that mode makes it: its path, its values, nothing left out.
    const flat: ChainDocument = mode ? chainInMode(doc, mode.id, withFiles) : doc;
    if (format === 'json') {
      // Without a mode the chain file needs no engine: it is the document as the schema
      // accepts it, so a chain the engine refuses can still be taken elsewhere and fixed.
      const text = mode
        ? { ...flat, description: `Mode "${mode.name}" (${mode.kind}) of the chain "${doc.name}". ${doc.description}`.trim() } // prettier-ignore
        : doc;
      return {
        text: JSON.stringify(text, null, 2) + '\n',
        contentType: 'application/json; charset=utf-8',
        extension: 'chain.json',
      };
    }
    if (format === 'spice') {
      // The first line of a netlist is its title; the mode goes in the comment below it.
      const [title, ...rest] = chainToSpice(flat, withFiles).split('\n');
      return {
        text: [title, ...(mode ? [modeLine('*', mode)] : []), ...rest].join('\n'),
        contentType: 'text/plain; charset=utf-8',
        extension: 'cir',
      };
    }
    const touchstone = chainToTouchstone(flat, { z0: z0 ?? 50, version, ...withFiles });
    const text = mode ? withModeLine(touchstone, modeLine('!', mode)) : touchstone;
    return {
      text,
      contentType: 'text/plain; charset=utf-8',
      extension: 's2p',
      referenceOhm: z0 ?? 50,
      ...(version === '2.0' ? { content: 'v2' } : {}),
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
  options: ExportOptions,
): Promise<void> {
  const mode = modeOfExport(doc, format, options.modeId);
  const file = await exportFile(em, doc, format, options, mode);
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
    await sendExport(em, res, chain.document, query.format, {
      z0: query.z0,
      workspaceId: chain.workspace.id,
      modeId: query.mode,
      version: query.version,
    });
  });
  return router;
}
