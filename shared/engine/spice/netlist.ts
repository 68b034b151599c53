/**
 * SPICE netlist of a chain, for checking the engine in a general circuit simulator
 * (written for ngspice; offered to users as an export, so it is meant to be read).
 *
 * Nodes `n0 … nM` are the chain's stage boundaries (the engine's user-level nodes): `n0` is
 * the source terminal, `nM` the load terminal, two-port k sits between `nk` and `n(k+1)`.
 * Each stage's own lines come from its model's `spice()` with the element prefix `s<k>`
 * (k = position in the chain, 0 = source), under a comment with the stage's label.
 *
 * The `.ac` line reproduces the chain's sweep: `lin` sweeps exactly; `log` sweeps as
 * `.ac dec` when the points fall on whole points per decade, otherwise as the nearest
 * `.ac dec` grid, reported back (`exactGrid: false`) so callers run the engine on ngspice's
 * frequencies instead.
 */
import type { ChainDocument } from '../../schema/chain';
import type { SweepSpec } from '../core/sweep';
import { buildChain, stageName, type BuiltChain, type BuiltStage } from '../core/build';
import type { MeasuredNetwork, StageDefinition } from '../types';
import { defaultCatalogue } from '../default-catalogue';

/** A stage that SPICE cannot express (mixer, measured data, IF block). */
export class SpiceExportError extends Error {
  constructor(
    readonly stageId: string,
    message: string,
  ) {
    super(message);
    this.name = 'SpiceExportError';
  }
}

export interface ChainToSpiceOptions {
  /** The sweep to write (default: the chain's own sweep). */
  sweep?: SweepSpec;
  /** User-level nodes whose voltages are written (default: all). */
  probeNodes?: number[];
  /** Name of the table file the control block writes (default `chain-ac.txt`). */
  dataFile?: string;
  /** Stage types to accept (default: the product's catalogue). */
  catalogue?: readonly StageDefinition[];
  /** Parsed measured data files by `dataFileId` (see `BuildOptions.dataFiles`). */
  dataFiles?: Readonly<Record<string, MeasuredNetwork>>;
}

/** A netlist with what a caller needs to read its results. */
export interface SpiceDeck {
  netlist: string;
  dataFile: string;
  /** The `.ac` line. */
  acLine: string;
  /** Whether ngspice's grid is the sweep's own (false: run the engine on `freqsHz`). */
  exactGrid: boolean;
  /** The frequencies ngspice will use, Hz (computed as ngspice does). */
  freqsHz: Float64Array;
  /** Vector names for the probed nodes, e.g. `v(n2)`, keyed by user-level node. */
  nodeVectors: Map<number, string>;
  /** Vector of the source's current (ngspice sign: into the source's + terminal). */
  sourceCurrent: string;
  /** Number of user-level nodes (M + 1). */
  nodeCount: number;
  /** The chain as built for the netlist (the source's EMF, the stages' models). */
  built: BuiltChain;
}

/**
 * Writes an ngspice netlist of a chain.
 * @throws ChainValidationError when the chain is invalid; SpiceExportError naming the stage
 *   when a stage cannot be written in SPICE
 */
export function chainToSpice(doc: ChainDocument, options: ChainToSpiceOptions = {}): string {
  return chainToSpiceDeck(doc, options).netlist;
}

/** Like {@link chainToSpice}, with the grid and vector names needed to read the results. */
export function chainToSpiceDeck(doc: ChainDocument, options: ChainToSpiceOptions = {}): SpiceDeck {
  const catalogue = options.catalogue ?? defaultCatalogue();
  if (!catalogue)
    throw new Error('spice export: no stage catalogue is installed; pass one in the options');
  const built = buildChain(
    doc,
    catalogue,
    options.dataFiles ? { dataFiles: options.dataFiles } : {},
  );
  const sweep = options.sweep ?? built.settings.sweep;
  const dataFile = options.dataFile ?? 'chain-ac.txt';
  const m = built.twoPorts.length;
  const node = (k: number) => `n${k}`;
  const name = doc.name.trim() || 'chain';

  const lines: string[] = [
    `Chainwright chain "${oneLine(name)}"`,
    `* ngspice netlist written by Chainwright. Nodes n0..n${m} are the stage boundaries:`,
    `* n0 = source terminal, n${m} = load terminal. Voltages are PEAK phasors.`,
  ];
  const stages = [built.source, ...built.twoPorts, built.load];
  stages.forEach((stage, position) => {
    const [inNode, outNode] =
      position === 0
        ? ['0', node(0)]
        : position === stages.length - 1
          ? [node(m), '0']
          : [node(position - 1), node(position)];
    lines.push(
      '',
      `* ${stageName(stage.index, stage.label, stage.type)}: ${describeNodes(position, stages.length, inNode, outNode)}`,
    );
    lines.push(...stageLines(stage, inNode, outNode, `s${position}`));
  });

  const probes = options.probeNodes ?? Array.from({ length: m + 1 }, (_, k) => k);
  for (const k of probes) {
    if (!Number.isInteger(k) || k < 0 || k > m) {
      throw new RangeError(`spice export: probe node ${k} is not a node of this chain (0..${m})`);
    }
  }
  const nodeVectors = new Map(probes.map((k) => [k, `v(${node(k)})`]));
  const sourceCurrent = `i(Vs0)`;
  const grid = acGrid(sweep);
  lines.push(
    '',
    '* AC sweep; the table has one row per frequency: f, then re and im of each vector.',
    '.control',
    'set wr_singlescale',
    'set wr_vecnames',
    'option numdgt=15',
    grid.acLine,
    `wrdata ${dataFile} ${[...nodeVectors.values(), sourceCurrent].join(' ')}`,
    'rusage',
    '.endc',
    '.end',
  );
  return {
    netlist: lines.join('\n') + '\n',
    dataFile,
    acLine: grid.acLine,
    exactGrid: grid.exact,
    freqsHz: grid.freqsHz,
    nodeVectors,
    sourceCurrent,
    nodeCount: m + 1,
    built,
  };
}

function stageLines(stage: BuiltStage, inNode: string, outNode: string, prefix: string): string[] {
  const who = stageName(stage.index, stage.label, stage.type);
  if (!stage.model.spice) {
    throw new SpiceExportError(
      stage.id,
      `${who} cannot be written as a SPICE netlist (frequency translation, measured data ` +
        'and filter blocks have no SPICE elements); remove it or replace it with lumped parts to export',
    );
  }
  const body = stage.model.spice(inNode, outNode, prefix);
  if (stage.definition.role === 'source' && !body.some((l) => l.startsWith(`V${prefix} `))) {
    throw new SpiceExportError(
      stage.id,
      `${who}: its SPICE lines have no source named V${prefix} (programming error)`,
    );
  }
  return body;
}

function describeNodes(position: number, count: number, inNode: string, outNode: string): string {
  if (position === 0) return `source, drives ${outNode}`;
  if (position === count - 1) return `load, ${inNode} to ground`;
  return `${inNode} -> ${outNode}`;
}

function oneLine(s: string): string {
  return s.replace(/[\r\n]+/g, ' ').slice(0, 120);
}

/**
 * The `.ac` line for a sweep and the frequencies ngspice will use (`exact`: the same grid as
 * the engine's `frequencyGrid(sweep)`).
 */
export function acGrid(sweep: SweepSpec): {
  acLine: string;
  exact: boolean;
  freqsHz: Float64Array;
} {
  const { startHz, stopHz, points } = sweep;
  const num = (v: number) => String(v);
  if (sweep.scale === 'lin' || points === 1 || startHz === stopHz) {
    const freqsHz = new Float64Array(points);
    const step = points > 1 ? (stopHz - startHz) / (points - 1) : 0;
    for (let i = 0; i < points; i++)
      freqsHz[i] = i === points - 1 && points > 1 ? stopHz : startHz + step * i;
    return { acLine: `ac lin ${points} ${num(startHz)} ${num(stopHz)}`, exact: true, freqsHz };
  }
  // ngspice (checked on ngspice-39) makes floor(decades·perDecade) intervals and spreads them
  // geometrically from start to stop exactly. Look for a whole perDecade that gives the
  // sweep's own interval count; otherwise take the nearest and report the grid it makes.
  const decades = Math.log10(stopHz / startHz);
  const intervals = (p: number) => Math.floor(decades * p + 1e-9);
  const candidate = Math.max(1, Math.ceil((points - 1) / decades - 1e-9));
  const exact = intervals(candidate) === points - 1;
  const perDecade = exact ? candidate : Math.max(1, Math.round((points - 1) / decades));
  const count = Math.max(1, intervals(perDecade)) + 1;
  const ratio = Math.log(stopHz / startHz) / (count - 1);
  const freqsHz = Float64Array.from({ length: count }, (_, i) =>
    i === count - 1 ? stopHz : startHz * Math.exp(ratio * i),
  );
  return { acLine: `ac dec ${perDecade} ${num(startHz)} ${num(stopHz)}`, exact, freqsHz };
}
