/**
 * Command-line analysis of a chain file.
 *
 *   npm run analyze -- <chain.json> [--mode <id>] [--sweep] [--plan] [--json] [--spice] [--touchstone [--z0 <ohm>]] [--timing]
 *   npm run analyze -- <chain.json> --sweep-only [--mode <id>] [--json] [--timing]
 *   npm run analyze -- <chain.json> --list-modes [--json]
 *   npm run analyze -- --list-types [--json]
 *
 * Exit codes: 0 done; 1 wrong usage; 2 the file cannot be read or is not JSON; 3 the chain
 * is not valid (each problem on its own line); 4 the chain cannot be exported in the asked
 * form (a stage with no SPICE form, a frequency-translating stage in a Touchstone export).
 */
import { readFileSync, writeSync } from 'node:fs';
import { delimiter } from 'node:path';
import { startupSnapshot } from 'node:v8';
import {
  analyzeChain,
  ChainValidationError,
  sweepChain,
  sweepChainInChunks,
  hasModes,
  modeView,
  STAGE_DEFINITIONS,
  StageParameterError,
  type SolveClock,
  type StageDefinition,
  type SweepReport,
} from '../shared/engine';
import { releaseSharedWorkspaces } from '../shared/engine/core/nodes';
import { chainToSpice, SpiceExportError } from '../shared/engine/spice/netlist';
import { budgetText } from '../shared/io/budget-text';
import { planText } from '../shared/io/plan-text';
import { chainToTouchstone, TouchstoneExportError } from '../shared/io/chain-touchstone';
import { CHAIN_FORMAT, CHAIN_FORMAT_VERSION, type ChainDocument } from '../shared/schema/chain';
import { ChainDocumentError, parseChainDocument } from '../shared/schema/parse-chain';
import { ByteSink } from './cli/byte-sink';
import {
  writeResultJson,
  writeSweepJson,
  writeSweepTable,
  writeSweepTableHeader,
  writeSweepTableRows,
} from './cli/stream-sweep';
import { DESIGN_USAGE, runDesignCli, takeDesignOption } from './design-cli';
import { modeReportText, modesText } from './cli/mode-text';

const USAGE = `usage: analyze <chain.json> [--mode <id>] [--sweep] [--plan] [--json] [--spice] [--touchstone [--z0 <ohm>]] [--timing]
       analyze <chain.json> --sweep-only [--mode <id>] [--json] [--timing]
       analyze <chain.json> --list-modes [--json]
       analyze --list-types [--json]

  (no option)    the budget table at f0: nodes, stages, resonators, selectivity, levels, flags
  --mode <id>    analyse (or export) the chain in this mode (default: its first mode)
  --list-modes   the chain's modes: id, kind (receive, transmit, state) and name
  --sweep        add the sweep (a table, or arrays with --json)
  --sweep-only   the sweep alone, without the analysis at f0 (a table, or arrays with --json):
                 the same numbers as --sweep, sooner and in less memory for a long sweep
  --plan         add the receiver plan: spurs, strong signals, outside noise, converter
  --json         the whole analysis as JSON
  --spice        an ngspice netlist of the chain
  --touchstone   Touchstone 1.1 S-parameters of the stages between source and load
  --z0 <ohm>     reference resistance of the Touchstone file (default 50)
  --list-types   the stage types with their parameters, units and defaults
  --timing       say on standard error how long the sweep's solve, the engine's whole analysis
                 (with --sweep-only: the sweep alone; as a table, solved and written a chunk
                 of points at a time, the chunks' times without the writing between them)
                 and the whole process took (seconds)

${DESIGN_USAGE}`;

/** A failure with its exit code and the lines to print. */
class CliError extends Error {
  constructor(
    readonly code: number,
    message: string,
  ) {
    super(message);
  }
}

interface Options {
  file?: string;
  sweep: boolean;
  sweepOnly: boolean;
  plan: boolean;
  json: boolean;
  spice: boolean;
  touchstone: boolean;
  listTypes: boolean;
  listModes: boolean;
  timing: boolean;
  mode?: string;
  z0: number;
  /** Design assistant options (scripts/design-cli.ts). */
  design: Map<string, string>;
}

function parseArgs(argv: string[]): Options {
  const o: Options = {
    sweep: false,
    sweepOnly: false,
    plan: false,
    json: false,
    spice: false,
    touchstone: false,
    listTypes: false,
    listModes: false,
    timing: false,
    z0: 50,
    design: new Map(),
  };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    let taken: number;
    try {
      taken = takeDesignOption(argv, i, o.design);
    } catch (e) {
      throw new CliError(1, (e as Error).message);
    }
    if (taken > 0) i += taken - 1;
    else if (a === '--sweep') o.sweep = true;
    else if (a === '--sweep-only') o.sweepOnly = true;
    else if (a === '--plan') o.plan = true;
    else if (a === '--json') o.json = true;
    else if (a === '--spice') o.spice = true;
    else if (a === '--touchstone') o.touchstone = true;
    else if (a === '--list-types') o.listTypes = true;
    else if (a === '--list-modes') o.listModes = true;
    else if (a === '--timing') o.timing = true;
    else if (a === '--mode') {
      o.mode = argv[++i];
      if (!o.mode || o.mode.startsWith('-'))
        throw new CliError(1, "--mode needs the id of one of the chain's modes (see --list-modes)");
    } else if (a === '--z0') {
      o.z0 = Number(argv[++i]);
      if (!(o.z0 > 0))
        throw new CliError(1, `--z0 needs a resistance above 0 ohm (got ${argv[i]})`);
    } else if (a === '--help' || a === '-h') throw new CliError(0, USAGE);
    else if (a.startsWith('-')) throw new CliError(1, `unknown option ${a}\n${USAGE}`);
    else if (o.file) throw new CliError(1, `one chain file at a time (got ${o.file} and ${a})`);
    else o.file = a;
  }
  if ([o.spice, o.touchstone, o.listTypes].filter(Boolean).length > 1) {
    throw new CliError(1, 'choose one of --spice, --touchstone and --list-types');
  }
  if (!o.file && !o.listTypes) throw new CliError(1, `no chain file given\n${USAGE}`);
  if (o.sweepOnly) {
    const others = Object.entries({
      '--sweep': o.sweep,
      '--plan': o.plan,
      '--spice': o.spice,
      '--touchstone': o.touchstone,
      '--list-types': o.listTypes,
      '--list-modes': o.listModes,
      'a design option': o.design.size > 0,
    }).filter(([, given]) => given);
    if (others.length > 0) {
      throw new CliError(
        1,
        `--sweep-only writes the sweep alone and takes only --mode, --json and --timing; ` +
          `leave out ${others.map(([name]) => name).join(', ')} (for the analysis with its sweep, use --sweep)`,
      );
    }
  }
  return o;
}

function readJson(file: string): unknown {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why =
      code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : String(e);
    throw new CliError(2, `cannot read chain file ${file}: ${why}`);
  }
  try {
    return JSON.parse(text);
  } catch (e) {
    const msg = (e as Error).message;
    const pos = /position (\d+)/.exec(msg);
    const where = pos ? ` at ${lineAndColumn(text, Number(pos[1]))}` : '';
    throw new CliError(2, `${file} is not valid JSON${where}: ${msg}`);
  }
}

function lineAndColumn(text: string, position: number): string {
  const before = text.slice(0, position).split('\n');
  return `line ${before.length}, column ${before[before.length - 1].length + 1}`;
}

/**
 * The chain document in `raw`, parsed once by the chain schema.
 * @throws CliError (exit 3) listing the problems one a line, naming the stage when the path
 *   is inside one
 */
function readDocument(raw: unknown, file: string): ChainDocument {
  const problems = (lines: string[]) =>
    new CliError(
      3,
      `${file}: ${lines.length} problem(s) in the chain:\n${lines.map((p) => `  ${p}`).join('\n')}`,
    );
  const head = (raw ?? {}) as { format?: unknown; formatVersion?: unknown };
  // Name what was found, so an old reader facing a newer file says so plainly.
  if (head.format !== undefined && head.format !== CHAIN_FORMAT) {
    throw problems([
      `format: this is not a chain file (format ${JSON.stringify(head.format)}; expected "${CHAIN_FORMAT}")`,
    ]);
  }
  if (head.formatVersion !== undefined && head.formatVersion !== CHAIN_FORMAT_VERSION) {
    throw problems([
      `formatVersion: ${JSON.stringify(head.formatVersion)} is not a version this program reads ` +
        `(it reads ${CHAIN_FORMAT_VERSION}); use a program that knows that version or convert the file`,
    ]);
  }
  try {
    return parseChainDocument(raw, file);
  } catch (e) {
    if (!(e instanceof ChainDocumentError)) throw e;
    const stages = (raw as { stages?: unknown[] } | null)?.stages;
    throw problems(
      e.problems.map(({ path, message }) => {
        let who = '';
        if (path[0] === 'stages' && path.length > 1 && Array.isArray(stages)) {
          const st = (stages[Number(path[1])] ?? {}) as { id?: unknown; type?: unknown };
          who = `stage ${Number(path[1]) + 1} (${String(st.id ?? '?')}, ${String(st.type ?? '?')}) `;
        }
        return `${formatPath(path)}: ${who}${message}`;
      }),
    );
  }
}

function formatPath(path: (string | number)[]): string {
  if (path.length === 0) return '(document)';
  return path.map((p, i) => (/^\d+$/.test(String(p)) ? `[${p}]` : i === 0 ? p : `.${p}`)).join('');
}

function listTypes(catalogue: readonly StageDefinition[], json: boolean): string {
  if (json) {
    const info = catalogue.map(({ build: _build, ...rest }) => rest);
    return JSON.stringify(info, null, 2);
  }
  return catalogue
    .map((d) => {
      const params = d.params.map((p) => {
        const unit = p.unit === 'none' || p.unit === 'ratio' ? '' : ` ${p.unit}`;
        const options = p.options ? ` (${p.options.map((o) => o.value).join(' | ')})` : '';
        return `    ${p.key} = ${JSON.stringify(p.default)}${unit}${options}  ${p.label}`;
      });
      return [`${d.type}  [${d.role}, ${d.category}]  ${d.label}: ${d.summary}`, ...params].join(
        '\n',
      );
    })
    .join('\n');
}

/** A design assistant's answer, its refusals as exit code 3 with the reason. */
function runDesign(
  doc: ChainDocument,
  o: Options,
  catalogue: readonly StageDefinition[],
): string | null {
  try {
    return runDesignCli(doc, o.design, o.json, { catalogue });
  } catch (e) {
    if (e instanceof StageParameterError || (e instanceof Error && e.constructor === Error)) {
      throw new CliError(3, `${o.file}: ${e.message}`);
    }
    throw e;
  }
}

/**
 * What `--timing` reports, seconds (set when it ran): the engine's analysis alone, and within
 * it the sweep's solve (every node's voltage and impedance at every point).
 */
const timings: { analysisS?: number; solveS?: number } = {};

/**
 * The `--timing` lines: the analysis alone (the engine's solve of every point, as a circuit
 * simulator reports its own analysis time, nothing written yet) and the whole process from
 * Node's time origin (its start-up, the analysis and the output).
 */
function timingText(endedAt: number): string {
  const whole = endedAt / 1000;
  const lines = [`timing: whole process ${whole.toFixed(4)} s`];
  if (timings.analysisS !== undefined) {
    lines.unshift(`timing: analysis ${timings.analysisS.toFixed(4)} s`);
  }
  if (timings.solveS !== undefined) {
    lines.unshift(`timing: solve ${timings.solveS.toFixed(4)} s`);
  }
  return lines.join('\n') + '\n';
}

/** Runs the CLI, writing its output into `out` (a sweep row by row, as it is formatted). */
function run(argv: string[], out: ByteSink): void {
  const write = (text: string) => out.text(text);
  const o = parseArgs(argv);
  if (o.timing) process.on('exit', () => writeSync(2, timingText(performance.now())));
  const catalogue = STAGE_DEFINITIONS;
  if (o.listTypes) return write(listTypes(catalogue, o.json) + '\n');
  const full = readDocument(readJson(o.file!), o.file!);
  if (o.listModes) {
    const modes = full.modes ?? [];
    return write((o.json ? JSON.stringify(modes, null, 2) : modesText(modes)) + '\n');
  }
  try {
    // Every output below is of the chain in one mode (a chain without modes: as written).
    const inMode = hasModes(full) || o.mode !== undefined;
    const view = inMode ? modeView(full, o.mode, catalogue) : undefined;
    const doc: ChainDocument = view ? { ...view.doc, name: `${full.name} — ${view.mode?.name}` } : full; // prettier-ignore
    if (o.spice) return write(chainToSpice(doc, { catalogue }).trimEnd() + '\n');
    if (o.touchstone)
      return write(chainToTouchstone(doc, { catalogue, z0: o.z0 }).trimEnd() + '\n');
    const designed = runDesign(doc, o, catalogue);
    if (designed !== null) return write(designed + '\n');
    const clock: SolveClock | undefined = o.timing ? {} : undefined;
    /**
     * Runs the engine, noting for --timing how long it and its solve took; `writingMs`, the
     * time it spent in the caller's writing, is not the engine's.
     */
    const timed = <T>(engine: () => T, writingMs = () => 0): T => {
      const started = performance.now();
      const done = engine();
      if (o.timing) timings.analysisS = (performance.now() - started - writingMs()) / 1000;
      if (clock?.solveMs !== undefined) timings.solveS = clock.solveMs / 1000;
      return done;
    };
    if (o.sweepOnly && !o.json) {
      // Solved and written a chunk of points at a time (the table is row by row): a long
      // sweep's solve reuses one chunk's memory instead of first touching all of it.
      let writing = 0;
      const visit = (chunk: SweepReport, from: number) => {
        const at = clock ? performance.now() : 0;
        if (from === 0) writeSweepTableHeader(chunk, out);
        writeSweepTableRows(chunk, out);
        if (clock) writing += performance.now() - at;
      };
      return timed(() => sweepChainInChunks(full, { catalogue, mode: o.mode, clock }, visit), () => writing); // prettier-ignore
    }
    if (o.sweepOnly) {
      // Written out before anything else runs, so the report may read the solve in place.
      const sweep = timed(() => sweepChain(full, { catalogue, mode: o.mode, clock, inPlace: true })); // prettier-ignore
      return writeSweepJson(sweep, write);
    }
    const result = timed(() => analyzeChain(full, { catalogue, sweep: o.sweep, plan: o.plan ? 'full' : false, mode: o.mode, clock })); // prettier-ignore
    if (o.json) return writeResultJson(result, write);
    const { sweep, ...atF0 } = result;
    write(budgetText(doc.name, atF0) + '\n');
    const modeLines = modeReportText(result);
    if (modeLines) write(`\n${modeLines}\n`);
    if (result.plan) write(`\n${planText(result.plan)}\n`);
    if (sweep) {
      write('\nSweep\n');
      writeSweepTable(sweep, out);
    }
  } catch (e) {
    if (e instanceof ChainValidationError) {
      const lines = e.issues.map((i) => `  ${formatPath(i.path)}: ${i.message}`);
      throw new CliError(
        3,
        `${o.file}: ${e.issues.length} problem(s) in the chain:\n${lines.join('\n')}`,
      );
    }
    if (e instanceof SpiceExportError || e instanceof TouchstoneExportError) {
      throw new CliError(4, `${o.file}: ${e.message}`);
    }
    throw e;
  }
}

/**
 * Standard output goes through a buffer written with writeSync, standard error straight to
 * its descriptor: neither loads Node's streams, which would cost every run their start-up.
 */
function main(argv: string[]): void {
  const out = new ByteSink(1);
  try {
    run(argv, out);
    out.flush();
  } catch (e) {
    out.flush();
    if (e instanceof CliError) {
      if (e.code === 0) {
        out.text(e.message + '\n');
        out.flush();
      } else writeSync(2, e.message + '\n');
      process.exitCode = e.code;
      return;
    }
    writeSync(
      2,
      `analyze: internal error: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`,
    );
    process.exitCode = 5;
  }
}

/**
 * Runs the CLI and ends the process as soon as its output is written (every write above is
 * synchronous): nothing is left to run, and Node's own ending (its handles, the heap of a
 * long sweep handed back) would only add to the time the caller waits. The exit code is
 * the one `main` set; `--timing`'s line is written on the way out.
 */
function mainThenExit(argv: string[]): never {
  main(argv);
  process.exit();
}

/**
 * Built into a V8 start-up snapshot (scripts/bench/bundle-cli.ts), the bundle's modules are
 * already loaded when the process starts, and main runs from there; the arguments then
 * follow the executable directly, as there is no script path. Before the snapshot is taken,
 * the chain files named in CW_CLI_WARM_UP (path-delimited) are analysed once with their
 * sweep and swept once alone, their output discarded, so the functions an analysis runs are compiled already when a run starts.
 */
function buildingSnapshot(): void {
  for (const file of (process.env.CW_CLI_WARM_UP ?? '').split(delimiter).filter(Boolean)) {
    main([file, '--sweep']);
    main([file, '--sweep-only']);
  }
  // The warm-up's workspaces would only make the snapshot, and every run's memory, larger.
  releaseSharedWorkspaces();
  process.exitCode = undefined;
  startupSnapshot.setDeserializeMainFunction(() => mainThenExit(process.argv.slice(1)));
}

if (startupSnapshot?.isBuildingSnapshot()) buildingSnapshot();
else mainThenExit(process.argv.slice(2));
