/**
 * Runs Debian's ngspice in batch mode (`ngspice -b`) on a netlist string, in a fresh
 * temporary folder, and reads back the `wrdata` table its `.control` block writes.
 *
 * Tests use this to check the engine against a general circuit simulator. When ngspice is
 * missing the run fails with the command to install it; it is never skipped.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  parseRusage,
  parseWrdata,
  type AcTable,
  type SpiceTimes,
} from '../../../shared/engine/spice/output';

export const INSTALL_HINT = "install Debian's ngspice: apt-get install -y ngspice";

export interface NgspiceRun {
  stdout: string;
  stderr: string;
  /** Contents of the files the netlist wrote, by name (only those asked for). */
  files: Record<string, string>;
  /** Wall time of the whole `ngspice -b` process, ms. */
  wallMs: number;
  times: SpiceTimes;
}

/**
 * Runs `ngspice -b` on `netlist` and returns its output and the named result files.
 * @throws Error with the install command when ngspice is missing, or with ngspice's own
 *   messages when it fails or writes no result file
 */
export function runNgspice(
  netlist: string,
  outputFiles: string[],
  options: { timeoutMs?: number; command?: string } = {},
): NgspiceRun {
  const dir = mkdtempSync(join(tmpdir(), 'cw-spice-'));
  try {
    writeFileSync(join(dir, 'circuit.cir'), netlist);
    const started = process.hrtime.bigint();
    const proc = spawnSync(options.command ?? 'ngspice', ['-b', 'circuit.cir'], {
      cwd: dir,
      encoding: 'utf8',
      timeout: options.timeoutMs ?? 60_000,
      maxBuffer: 64 * 1024 * 1024,
    });
    const wallMs = Number(process.hrtime.bigint() - started) / 1e6;
    const err = proc.error as NodeJS.ErrnoException | undefined;
    if (err?.code === 'ENOENT') throw new Error(`ngspice was not found on PATH: ${INSTALL_HINT}`);
    if (err) throw new Error(`ngspice did not finish: ${err.message}`);
    const files: Record<string, string> = {};
    for (const name of outputFiles) {
      const path = join(dir, name);
      if (!existsSync(path)) {
        throw new Error(
          `ngspice wrote no ${name} (exit ${proc.status}).\n--- stderr ---\n${proc.stderr}` +
            `\n--- stdout (end) ---\n${proc.stdout.slice(-2000)}\n--- netlist ---\n${netlist.slice(0, 4000)}`,
        );
      }
      files[name] = readFileSync(path, 'utf8');
    }
    return {
      stdout: proc.stdout,
      stderr: proc.stderr,
      files,
      wallMs,
      times: parseRusage(proc.stdout),
    };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Runs a netlist whose control block writes one `wrdata` table to `dataFile`, and parses it. */
export function runAc(netlist: string, dataFile = 'ac.txt'): AcTable & { run: NgspiceRun } {
  const run = runNgspice(netlist, [dataFile]);
  return { ...parseWrdata(run.files[dataFile]), run };
}

/** The `.control` block lines that run `.ac` and write `vectors` to `dataFile`. */
export function acControl(ac: string, vectors: string[], dataFile = 'ac.txt'): string[] {
  return [
    '.control',
    'set wr_singlescale',
    'set wr_vecnames',
    'option numdgt=15',
    ac,
    `wrdata ${dataFile} ${vectors.join(' ')}`,
    '.endc',
  ];
}

/** Complex vector `name` at point i (throws naming the vector when it is missing). */
export function vectorAt(table: AcTable, name: string, i: number): [number, number] {
  const v = table.vectors.get(name.toLowerCase());
  if (!v)
    throw new Error(
      `ngspice table has no vector ${name}; it has ${[...table.vectors.keys()].join(', ')}`,
    );
  return [v.re[i], v.im[i]];
}
