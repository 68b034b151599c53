/**
 * The design assistants on the command line, as options of `analyze` (scripts/analyze.ts
 * collects them with `takeDesignOption` and hands the parsed chain to `runDesignCli`).
 */
import {
  DEFAULT_COIL_FORM,
  matchHere,
  snapChain,
  stageOf,
  stageParts,
  stagePartsCsv,
  tunePair,
  tuneResonator,
  type CoilForm,
  type DesignOptions,
  type PreferredSeries,
} from '../shared/engine/design';
import { formatEngineering } from '../shared/units/format';
import type { ChainDocument } from '../shared/schema/chain';
import type { UnitKind } from '../shared/engine/types';

export const DESIGN_USAGE = `design assistants (print their answer instead of the budget; --json for JSON):
  --tune <stage>[/<resonator>] --solve <stage>.<value> [--to <Hz>]
                 solve one L or C so the resonator resonates at --to (default f0)
  --peak-at <node> --solve <stage>.<value> [--to <Hz>]
                 solve one L or C so the pass-band peak at the node sits at --to
  --tune-pair <stage> --bandwidth <Hz> [--to <Hz>] [--kq <k·Q>]
                 a two-tank coupled bandpass for centre, −3 dB width and shape (1 = critical)
  --match-after <stage> [--q <Q>] [--k <k>] [--parasitic <F>]
                 every matching network for the node after the stage, analysed in place
  --snap <E6|E12|E24|E48|E96> [--stage <stage>]
                 snap parts to a preferred series and show before and after
  --parts <stage> [--former <m>] [--length <m> | --wire <m> --pitch <m>]
                 the stage's parts, with air-core coil turns (Wheeler) beside each inductor`;

const WITH_VALUE = new Set([
  '--tune',
  '--solve',
  '--to',
  '--peak-at',
  '--tune-pair',
  '--bandwidth',
  '--kq',
  '--match-after',
  '--q',
  '--k',
  '--parasitic',
  '--snap',
  '--stage',
  '--parts',
  '--former',
  '--length',
  '--wire',
  '--pitch',
]);

/**
 * If argv[i] is a design option, stores it (with its value) in `into` and returns how many
 * arguments it took; 0 when it is not one.
 * @throws Error when the option's value is missing.
 */
export function takeDesignOption(argv: string[], i: number, into: Map<string, string>): number {
  const a = argv[i];
  if (!WITH_VALUE.has(a)) return 0;
  const v = argv[i + 1];
  if (v === undefined || v.startsWith('--')) throw new Error(`${a} needs a value`);
  into.set(a, v);
  return 2;
}

function num(opts: Map<string, string>, key: string, what: string): number | undefined {
  const v = opts.get(key);
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!Number.isFinite(n)) throw new Error(`${key} needs ${what} (got ${v})`);
  return n;
}

const f = (v: number | null | undefined, unit: UnitKind) =>
  v === null || v === undefined || !Number.isFinite(v) ? '—' : formatEngineering(v, unit);

/** Runs the assistant the options name; null when none is named. */
export function runDesignCli(
  doc: ChainDocument,
  opts: Map<string, string>,
  json: boolean,
  options: DesignOptions = {},
): string | null {
  const out = (value: unknown, text: () => string) =>
    json ? JSON.stringify(value, null, 2) : text();
  const target = num(opts, '--to', 'a frequency in Hz') ?? doc.settings.f0Hz;
  if (opts.has('--tune') || opts.has('--peak-at')) {
    const [stageId, label] = (opts.get('--tune') ?? '').split('/');
    const peakNode = num(opts, '--peak-at', 'a node number');
    const solve = opts.get('--solve');
    if (!solve || !solve.includes('.')) throw new Error('--tune needs --solve <stage>.<value>');
    const [elStage, key] = solve.split('.');
    const r = tuneResonator(
      doc,
      {
        ...(stageId ? { resonator: { stageId, label: label ?? 'tank' } } : {}),
        element: { stageId: elStage, key },
        targetHz: target,
        ...(peakNode === undefined ? {} : { peakNode }),
      },
      options,
    );
    return out(r, () =>
      [
        `${solve}: ${f(r.previousValue, r.unit === 'henry' ? 'henry' : 'farad')} → ${f(r.value, r.unit === 'henry' ? 'henry' : 'farad')}`,
        `${r.target === 'peak' ? `peak at node ${r.peakNode}` : 'resonance'} ${f(r.resonanceHz, 'hertz')} (target ${f(target, 'hertz')}, off by ${r.relativeError.toExponential(1)})`,
        `loaded Q ${r.loadedQ?.toFixed(1) ?? '—'}, −3 dB width ${f(r.bandwidthHz, 'hertz')}`,
      ].join('\n'),
    );
  }
  if (opts.has('--tune-pair')) {
    const bandwidthHz = num(opts, '--bandwidth', 'a bandwidth in Hz');
    if (bandwidthHz === undefined) throw new Error('--tune-pair needs --bandwidth <Hz>');
    const r = tunePair(
      doc,
      {
        stageId: opts.get('--tune-pair')!,
        targetHz: target,
        bandwidthHz,
        kq: num(opts, '--kq', 'a number'),
      },
      options,
    );
    return out({ ...r, document: undefined }, () =>
      [
        `start (${r.start.formula}): L ${f(r.start.l, 'henry')}, C ${f(r.start.c, 'farad')}, k ${r.start.k.toFixed(4)}`,
        `answer on the chain: L ${f(r.values.l, 'henry')}, C ${f(r.values.c, 'farad')}` +
          (r.values.k !== undefined
            ? `, k ${r.values.k.toFixed(4)}`
            : `, Cc ${f(r.values.cc, 'farad')}`),
        `tanks at ${f(r.resonanceHz, 'hertz')}; −3 dB ${f(r.lowEdgeHz, 'hertz')} … ${f(r.highEdgeHz, 'hertz')} = ${f(r.bandwidthHz, 'hertz')}`,
      ].join('\n'),
    );
  }
  if (opts.has('--match-after')) {
    const r = matchHere(
      doc,
      {
        afterStageId: opts.get('--match-after')!,
        q: num(opts, '--q', 'a loaded Q'),
        k: num(opts, '--k', 'a coupling between 0 and 1'),
        parasiticC: num(opts, '--parasitic', 'a capacitance in F'),
      },
      options,
    );
    return out(r, () =>
      [
        `at ${f(r.fHz, 'hertz')}: source side ${r.zSource.re.toPrecision(4)} ${r.zSource.im < 0 ? '−' : '+'} j${Math.abs(r.zSource.im).toPrecision(4)} Ω, ` +
          `load side ${r.zLoad.re.toPrecision(4)} ${r.zLoad.im < 0 ? '−' : '+'} j${Math.abs(r.zLoad.im).toPrecision(4)} Ω`,
        ...r.candidates.map(
          (c) =>
            `${c.title}\n    ${c.parts.map((p) => `${p.place} ${f(p.value, p.part === 'L' ? 'henry' : 'farad')}`).join(', ')}` +
            `; Q ${c.loadedQ.toFixed(1)}; ` +
            (c.figures
              ? `return loss ${c.figures.returnLossDb.toFixed(1)} dB, gain ${c.figures.totalGainDb.toFixed(2)} dB, NF ${c.figures.noiseFigureDb.toFixed(2)} dB, −3 dB ${f(c.figures.networkBw3dbHz, 'hertz')}`
              : `not analysed: ${c.error}`),
        ),
        ...r.refused.map((x) => `no ${x.topology}: ${x.reason}`),
      ].join('\n'),
    );
  }
  if (opts.has('--snap')) {
    const series = opts.get('--snap')!.toUpperCase() as PreferredSeries;
    if (!['E6', 'E12', 'E24', 'E48', 'E96'].includes(series)) {
      throw new Error(`--snap takes E6, E12, E24, E48 or E96 (got ${opts.get('--snap')})`);
    }
    const r = snapChain(doc, { series, stageId: opts.get('--stage') }, options);
    return out(r, () =>
      [
        `${series}, ${r.rule}`,
        ...r.changes.map(
          (c) =>
            `${c.stageId}.${c.key}: ${c.before.toPrecision(4)} → ${c.after.toPrecision(4)} (${c.changePercent.toFixed(2)} %)`,
        ),
        ...r.resonators.map(
          (x) =>
            `${x.stageId} ${x.label}: ${f(x.beforeHz, 'hertz')} → ${f(x.afterHz, 'hertz')}, width ${f(x.beforeBandwidthHz, 'hertz')} → ${f(x.afterBandwidthHz, 'hertz')}`,
        ),
        `gain ${r.before.totalGainDb.toFixed(2)} → ${r.after.totalGainDb.toFixed(2)} dB, NF ${r.before.noiseFigureDb.toFixed(2)} → ${r.after.noiseFigureDb.toFixed(2)} dB`,
      ].join('\n'),
    );
  }
  if (opts.has('--parts')) {
    const stage = stageOf(doc, opts.get('--parts')!);
    const former = num(opts, '--former', 'a diameter in m');
    const length = num(opts, '--length', 'a length in m');
    const wire = num(opts, '--wire', 'a diameter in m');
    const pitch = num(opts, '--pitch', 'a pitch in m');
    const form: CoilForm =
      former === undefined
        ? DEFAULT_COIL_FORM
        : length !== undefined
          ? { formerDiameterM: former, lengthM: length }
          : { formerDiameterM: former, wireDiameterM: wire ?? 0.0005, pitchM: pitch ?? 0.001 };
    const rows = stageParts(stage, form, options);
    return out(rows, () => stagePartsCsv(stage, rows, form).trimEnd());
  }
  return null;
}
