/**
 * Compares the engine's sweep of a chain with ngspice's AC analysis of the chain's own
 * netlist (`chainToSpiceDeck`): every node voltage relative to the source EMF (dB and
 * degrees) and the input impedance at node 0, at every frequency.
 * Reference: ngspice (Debian package ngspice), run in the test.
 */
import { analyzeChain } from '../../../shared/engine/analyze';
import type { BuiltChain } from '../../../shared/engine/core/build';
import type { ChainDocument } from '../../../shared/schema/chain';
import { runNodeAnalysis } from '../../../shared/engine/core/nodes';
import { chainToSpiceDeck } from '../../../shared/engine/spice/netlist';
import type { StageDefinition, SweepReport } from '../../../shared/engine/types';
import { runAc, vectorAt } from './ngspice';

/** Where engine and ngspice differ most. */
export interface WorstPoint {
  fHz: number;
  /** "node 3" or "Zin". */
  where: string;
  dbError: number;
  degError: number;
  engine: { db: number; deg: number };
  spice: { db: number; deg: number };
}

export interface Agreement {
  points: number;
  nodes: number;
  /** Whether the chain's own sweep was compared (false: ngspice's nearest `dec` grid). */
  exactGrid: boolean;
  worstDb: WorstPoint;
  worstDeg: WorstPoint;
  /** The netlist that was run (for failure messages). */
  netlist: string;
}

const db = (re: number, im: number) => 20 * Math.log10(Math.hypot(re, im));
const deg = (re: number, im: number) => (Math.atan2(im, re) * 180) / Math.PI;
/** Difference of two angles in degrees, wrapped to [0, 180]. */
const angleGap = (a: number, b: number) => Math.abs(((((a - b) % 360) + 540) % 360) - 180);

/** The engine's node voltages and input impedance on an arbitrary grid, in the sweep's shape. */
function engineOnGrid(built: BuiltChain, freqs: Float64Array): SweepLike {
  const na = runNodeAnalysis(built, freqs);
  const P = freqs.length;
  const nodes = Array.from(built.userNodeFlat, (flat, index) => {
    const stepUpDb: number[] = [];
    const phaseDeg: number[] = [];
    for (let i = 0; i < P; i++) {
      const k = flat * P + i;
      stepUpDb.push(db(na.vRe[k] / na.emf[i], na.vIm[k] / na.emf[i]));
      phaseDeg.push(deg(na.vRe[k], na.vIm[k]));
    }
    return { index, stepUpDb, phaseDeg };
  });
  return {
    freqsHz: Array.from(freqs),
    nodes,
    zIn: { re: Array.from(na.zinRe.subarray(0, P)), im: Array.from(na.zinIm.subarray(0, P)) },
  };
}

type SweepLike = Pick<SweepReport, 'freqsHz' | 'nodes' | 'zIn'>;

const orWorst = (x: number) => (Number.isNaN(x) ? Infinity : x);

/**
 * Runs both and measures the worst disagreement.
 * @throws Error when ngspice's frequency grid is not the engine's (to 1e-12 relative)
 */
export function measureAgreement(
  doc: ChainDocument,
  catalogue: readonly StageDefinition[],
): Agreement {
  const deck = chainToSpiceDeck(doc, { catalogue });
  const spice = runAc(deck.netlist, deck.dataFile);
  // On the sweep's own grid the full analysis is compared; on ngspice's nearest `dec` grid
  // (a log sweep that does not fall on whole points per decade) the node analysis is.
  const sweep = deck.exactGrid
    ? analyzeChain(doc, { catalogue, sweep: true }).sweep!
    : engineOnGrid(deck.built, deck.freqsHz);
  const P = sweep.freqsHz.length;
  if (spice.freqsHz.length !== P) {
    throw new Error(
      `ngspice gave ${spice.freqsHz.length} points, the engine ${P} (${deck.acLine})`,
    );
  }
  for (let i = 0; i < P; i++) {
    if (Math.abs(spice.freqsHz[i] - sweep.freqsHz[i]) > 1e-12 * sweep.freqsHz[i]) {
      throw new Error(
        `frequency ${i} differs: ngspice ${spice.freqsHz[i]}, engine ${sweep.freqsHz[i]}`,
      );
    }
  }
  const emf = deck.built.source.model.emf;
  const none = (): WorstPoint => ({
    fHz: NaN,
    where: '',
    dbError: -1,
    degError: -1,
    engine: { db: NaN, deg: NaN },
    spice: { db: NaN, deg: NaN },
  });
  let worstDb = none();
  let worstDeg = none();
  const consider = (i: number, where: string, e: [number, number], s: [number, number]) => {
    const point: WorstPoint = {
      fHz: sweep.freqsHz[i],
      where,
      // NaN (a failed value on either side) counts as the worst possible error.
      dbError: orWorst(Math.abs(e[0] - s[0])),
      degError: orWorst(angleGap(e[1], s[1])),
      engine: { db: e[0], deg: e[1] },
      spice: { db: s[0], deg: s[1] },
    };
    if (point.dbError > worstDb.dbError) worstDb = point;
    if (point.degError > worstDeg.degError) worstDeg = point;
  };
  for (const node of sweep.nodes) {
    const vector = deck.nodeVectors.get(node.index)!;
    for (let i = 0; i < P; i++) {
      const [re, im] = vectorAt(spice, vector, i);
      const es = emf(sweep.freqsHz[i]);
      consider(
        i,
        `node ${node.index}`,
        [node.stepUpDb[i], node.phaseDeg[i]],
        [db(re / es, im / es), deg(re, im)],
      );
    }
  }
  for (let i = 0; i < P; i++) {
    const [vre, vim] = vectorAt(spice, deck.nodeVectors.get(0)!, i);
    // ngspice's i(V) flows into the source's + terminal; the chain draws the opposite.
    const [cre, cim] = vectorAt(spice, deck.sourceCurrent, i).map((v) => -v);
    const den = cre * cre + cim * cim;
    const zre = (vre * cre + vim * cim) / den;
    const zim = (vim * cre - vre * cim) / den;
    const [ere, eim] = [sweep.zIn.re[i], sweep.zIn.im[i]];
    consider(i, 'Zin', [db(ere, eim), deg(ere, eim)], [db(zre, zim), deg(zre, zim)]);
  }
  return {
    points: P,
    nodes: sweep.nodes.length,
    exactGrid: deck.exactGrid,
    worstDb,
    worstDeg,
    netlist: deck.netlist,
  };
}

/** Tolerances of the comparison: 0.01 dB and 0.1°. */
export const AGREEMENT = { db: 0.01, deg: 0.1 };

/**
 * Measures and throws, describing the worst point, when the engine and ngspice disagree by
 * more than 0.01 dB or 0.1° anywhere.
 */
export function expectAgreement(
  doc: ChainDocument,
  catalogue: readonly StageDefinition[],
): Agreement {
  const a = measureAgreement(doc, catalogue);
  const describe = (w: WorstPoint) =>
    `at ${w.fHz} Hz, ${w.where}: engine ${w.engine.db.toFixed(5)} dB ∠${w.engine.deg.toFixed(4)}°, ` +
    `ngspice ${w.spice.db.toFixed(5)} dB ∠${w.spice.deg.toFixed(4)}° ` +
    `(error ${w.dbError.toExponential(3)} dB, ${w.degError.toExponential(3)}°)`;
  if (!(a.worstDb.dbError <= AGREEMENT.db) || !(a.worstDeg.degError <= AGREEMENT.deg)) {
    throw new Error(
      `engine and ngspice disagree for "${doc.name ?? 'chain'}":\n  worst dB ${describe(a.worstDb)}\n` +
        `  worst phase ${describe(a.worstDeg)}\n--- netlist ---\n${a.netlist}`,
    );
  }
  return a;
}
