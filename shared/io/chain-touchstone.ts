/**
 * Touchstone export of a whole chain: the S-parameters of everything between the source
 * and the load (the cascade of every two-port's ABCD), with one reference resistance on
 * both ports, over the chain's sweep.
 */
import type { ChainDocument } from '../schema/chain';
import { buildChain, stageName } from '../engine/core/build';
import { frequencyGrid, type SweepSpec } from '../engine/core/sweep';
import { cascade, identityAbcd } from '../engine/core/abcd';
import { cascadeNoiseParameters } from '../engine/core/noise-correlation';
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
  /**
   * Specification version (default '1.1'). A 2.0 file states `[Reference]` for each port and,
   * when the cascade has noise parameters, `[Noise Data]` at the chain's centre frequency.
   */
  version?: '1.1' | '2.0';
}

/**
 * S-parameters of the chain's two-ports in cascade (source and load excluded).
 * @throws ChainValidationError for an invalid chain; TouchstoneExportError naming the stage
 *   when a stage translates frequency
 */
export function chainNetwork(
  doc: ChainDocument,
  options: ChainTouchstoneOptions & { withNoise?: boolean } = {},
): NetworkData {
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
  const net = abcdSweepToNetwork(freqs, total, options.z0 ?? 50);
  if (!options.withNoise) return net;
  const noise = cascadeNoiseParameters(built, net.z0);
  return noise ? { ...net, noise: [noise] } : net;
}

/**
 * Touchstone text (`.s2p`, version 1.1 or 2.0) of the chain's two-ports in cascade.
 * @throws as {@link chainNetwork}
 */
export function chainToTouchstone(
  doc: ChainDocument,
  options: ChainTouchstoneOptions = {},
): string {
  const v2 = options.version === '2.0';
  const net = chainNetwork(doc, { ...options, withNoise: v2 });
  const name = doc.name.replace(/[\r\n]+/g, ' ');
  const comments = [
    `Chainwright chain "${name}"`,
    'S-parameters of the stages between the source and the load, in cascade;',
    `reference ${net.z0} ohm on both ports. Port 1 faces the source, port 2 the load.`,
  ];
  if (v2) {
    comments.push(
      net.noise
        ? "Noise data: the cascade's noise parameters at the centre frequency, from the " +
            "chain's noise model (a stage given by its noise figure alone holds that figure " +
            'at the source impedance it sees in this chain).'
        : 'No noise data: the cascade has no noise parameters to state (no noise voltage, or ' +
            'no passive source impedance that minimises its noise).',
    );
  }
  return writeTouchstone(net, {
    format: options.format,
    unit: options.unit,
    comments,
    ...(v2 ? { version: '2.0' as const, twoPortOrder: '12_21' as const } : {}),
  });
}
