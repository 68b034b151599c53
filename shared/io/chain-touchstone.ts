/**
 * Touchstone export of a whole chain: the S-parameters of everything between the source
 * and the load (the cascade of every two-port's ABCD), with one reference resistance on
 * both ports, over the chain's sweep.
 */
import { buildChain, stageName, type ChainLike } from '../engine/core/build';
import { frequencyGrid, type SweepSpec } from '../engine/core/sweep';
import { cascade, identityAbcd } from '../engine/core/abcd';
import { defaultCatalogue } from '../engine/default-catalogue';
import type { MeasuredNetwork, StageDefinition } from '../engine/types';
import type { NetworkData } from './network-data';
import {
  abcdSweepToNetwork,
  writeTouchstone,
  type TouchstoneFormat,
  type TouchstoneUnit,
} from './touchstone-writer';

/** A chain whose two-ports do not form one ordinary two-port (e.g. a mixer translates). */
export class TouchstoneExportError extends Error {
  constructor(
    readonly stageId: string,
    message: string,
  ) {
    super(message);
    this.name = 'TouchstoneExportError';
  }
}

export interface ChainTouchstoneOptions {
  /** Reference resistance of both ports, ohm (default 50). */
  z0?: number;
  /** Frequencies (default: the chain's sweep). */
  sweep?: SweepSpec;
  format?: TouchstoneFormat;
  unit?: TouchstoneUnit;
  catalogue?: readonly StageDefinition[];
  /** Parsed measured data files by `dataFileId` (see `BuildOptions.dataFiles`). */
  dataFiles?: Readonly<Record<string, MeasuredNetwork>>;
}

/**
 * S-parameters of the chain's two-ports in cascade (source and load excluded).
 * @throws ChainValidationError for an invalid chain; TouchstoneExportError naming the stage
 *   when a stage translates frequency
 */
export function chainNetwork(doc: ChainLike, options: ChainTouchstoneOptions = {}): NetworkData {
  const built = buildChain(
    doc,
    options.catalogue ?? defaultCatalogue(),
    options.dataFiles ? { dataFiles: options.dataFiles } : {},
  );
  const freqs = frequencyGrid(options.sweep ?? built.settings.sweep);
  for (const stage of built.twoPorts) {
    if (stage.model.sections.some((s) => s.translate)) {
      throw new TouchstoneExportError(
        stage.id,
        `${stageName(stage.index, stage.label, stage.type)} changes the frequency, so the chain ` +
          'has no single set of S-parameters; export the stages before or after it separately',
      );
    }
  }
  const total = identityAbcd(freqs.length);
  const one = new Float64Array(8);
  for (let i = 0; i < freqs.length; i++) {
    for (const section of built.sections) {
      section.abcd(freqs[i], one, 0);
      cascade(total, 8 * i, one, 0, total, 8 * i);
    }
  }
  return abcdSweepToNetwork(freqs, total, options.z0 ?? 50);
}

/**
 * Touchstone 1.1 text (`.s2p`) of the chain's two-ports in cascade.
 * @throws as {@link chainNetwork}
 */
export function chainToTouchstone(
  doc: ChainLike & { name?: unknown },
  options: ChainTouchstoneOptions = {},
): string {
  const net = chainNetwork(doc, options);
  const name = typeof doc.name === 'string' ? doc.name.replace(/[\r\n]+/g, ' ') : 'chain';
  return writeTouchstone(net, {
    format: options.format,
    unit: options.unit,
    comments: [
      `Chainwright chain "${name}"`,
      'S-parameters of the stages between the source and the load, in cascade;',
      `reference ${net.z0} ohm on both ports. Port 1 faces the source, port 2 the load.`,
    ],
  });
}
