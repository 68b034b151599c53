/**
 * The file of an export (SPICE netlist, Touchstone, chain file), built from the document
 * alone: the analysis thread runs it (a Touchstone file is the whole chain's cascade at every
 * sweep point), the route only picks the mode and sends the text.
 */
import { chainInMode } from '../../shared/engine';
import type { MeasuredNetwork } from '../../shared/engine/types';
import { chainToSpice } from '../../shared/engine/spice/netlist';
import type { ExportFormat, TouchstoneVersion } from '../../shared/schema/api';
import type { ChainDocument, Mode } from '../../shared/schema/chain';
import { chainToTouchstone } from '../../shared/io/chain-touchstone';

export interface ExportFile {
  text: string;
  contentType: string;
  extension: string;
  /** The reference impedance the file's figures are given against, for its name. */
  referenceOhm?: number;
  /** What the name says the file holds beyond its kind ('v2' for a Touchstone 2.0 file). */
  content?: string;
}

/** What an export asks for: the format, its reference impedance and the mode it is of. */
export interface ExportSpec {
  format: ExportFormat;
  z0?: number;
  /** Touchstone specification version (default 1.1). */
  version?: TouchstoneVersion;
  mode?: Mode;
}

/** Whether building the file runs the engine (a chain file without a mode does not). */
export const exportNeedsEngine = (spec: ExportSpec) => spec.format !== 'json' || !!spec.mode;

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

/**
 * The export of `doc` as `spec` asks.
 * @throws what the engine throws: ChainValidationError, StageParameterError, and
 *   SpiceExportError or TouchstoneExportError naming a stage the format cannot express
 */
export function buildExportFile(
  doc: ChainDocument,
  spec: ExportSpec,
  dataFiles?: Record<string, MeasuredNetwork>,
): ExportFile {
  const { format, mode } = spec;
  const withFiles = dataFiles ? { dataFiles } : {};
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
  const z0 = spec.z0 ?? 50;
  const touchstone = chainToTouchstone(flat, { z0, version: spec.version, ...withFiles });
  return {
    text: mode ? withModeLine(touchstone, modeLine('!', mode)) : touchstone,
    contentType: 'text/plain; charset=utf-8',
    extension: 's2p',
    referenceOhm: z0,
    ...(spec.version === '2.0' ? { content: 'v2' } : {}),
  };
}
