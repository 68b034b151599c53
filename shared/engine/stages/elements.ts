/**
 * Distributed and resistive elements: attenuator pad, transmission line, T/R switch.
 */
import { StageParameterError } from '../errors';
import { formatNumber, formatQuantity } from '../core/format';
import type { StageDefinition } from '../types';
import { enumParam, numParam, readParams, SpiceWriter, spiceNum } from './common';
import { ladderSections, ladderSpice, type LadderElement } from './ladder';
import { setAbcd, transmissionLineAbcd } from './primitives';

const SPEED_OF_LIGHT = 299_792_458;
/** dB per neper, 20·log10(e). */
const DB_PER_NEPER = 20 / Math.LN10;
/**
 * Most loss along one line the analysis takes, dB (our rule). cosh(γl) grows as e^(αl): at
 * 1,000 dB (115 Np) the line's ABCD entries are about 1e50, and their products in the
 * impedance transforms stay inside double precision for every impedance the ranges allow;
 * well beyond it they overflow and every figure downstream turns into "not a number". No
 * cable worth modelling loses that much in a receiver.
 */
export const MAX_LINE_LOSS_DB = 1000;

/**
 * Resistive pad of `db` loss matched to z0 at both ports (K = 10^(dB/20)):
 * pi: shunt z0·(K+1)/(K−1), series z0·(K²−1)/(2K); T: series z0·(K−1)/(K+1),
 * shunt z0·2K/(K²−1). Standard closed forms (common practice).
 */
export function padElements(db: number, z0: number, form: 'pi' | 't'): LadderElement[] {
  const k = 10 ** (db / 20);
  if (form === 'pi') {
    const shunt: LadderElement = { part: 'R', place: 'shunt', value: (z0 * (k + 1)) / (k - 1) };
    return [shunt, { part: 'R', place: 'series', value: (z0 * (k * k - 1)) / (2 * k) }, shunt];
  }
  const series: LadderElement = { part: 'R', place: 'series', value: (z0 * (k - 1)) / (k + 1) };
  return [series, { part: 'R', place: 'shunt', value: (2 * k * z0) / (k * k - 1) }, series];
}

const PAD_PARAMS = [
  numParam('db', 'Attenuation', 'db', 6, { min: 0, exclusiveMin: true, max: 120 }),
  numParam('z0', 'Design impedance', 'ohm', 50, { min: 0, exclusiveMin: true }),
  enumParam('form', 'Form', [
    ['pi', 'Pi (shunt, series, shunt)'],
    ['t', 'T (series, shunt, series)'],
  ]),
];

/** Resistive attenuator. */
export const ATTENUATOR_PAD: StageDefinition = {
  type: 'attenuator-pad',
  category: 'element',
  role: 'two-port',
  label: 'Attenuator pad',
  summary: 'Three resistors giving a set loss while matching the design impedance at both ends.',
  params: PAD_PARAMS,
  build(values) {
    const p = readParams(PAD_PARAMS, values);
    const elements = padElements(p.num('db'), p.num('z0'), p.str('form') === 't' ? 't' : 'pi');
    return {
      sections: ladderSections(elements),
      noise: { kind: 'passive' },
      spice: ladderSpice(elements),
    };
  },
};

const LINE_PARAMS = [
  numParam('z0', 'Characteristic impedance', 'ohm', 50, { min: 0, exclusiveMin: true }),
  numParam('length', 'Length', 'metre', 1, { min: 0, tolerance: true }),
  numParam('vf', 'Velocity factor', 'ratio', 0.66, {
    min: 0,
    exclusiveMin: true,
    max: 1,
    help: 'Solid-polyethylene coax is about 0.66, foam 0.8 or more.',
  }),
  numParam('lossDbPerM', 'Loss at the reference frequency', 'db', 0, {
    min: 0,
    help: 'dB per metre; scaled with √f (conductor loss). 0 is lossless (and SPICE-exact).',
  }),
  numParam('refHz', 'Reference frequency for the loss', 'hertz', 100e6, {
    min: 0,
    exclusiveMin: true,
  }),
];

/** Coaxial or other uniform line. */
export const TRANSMISSION_LINE: StageDefinition = {
  type: 'transmission-line',
  category: 'element',
  role: 'two-port',
  label: 'Transmission line',
  summary: 'A length of cable or line: transforms impedance along its length and adds loss.',
  params: LINE_PARAMS,
  build(values, ctx) {
    const p = readParams(LINE_PARAMS, values);
    const [z0, len, vf, loss, ref] = ['z0', 'length', 'vf', 'lossDbPerM', 'refHz'].map((k) =>
      p.num(k),
    );
    // The loss grows with √f: refuse a line whose loss at the highest frequency the analysis
    // evaluates would pass the limit (300 dB/m stated at 1 Hz is 9.5 MdB at 1 GHz).
    const top = ctx.fMaxHz ?? ctx.f0Hz;
    const lossAtTop = loss * Math.sqrt(top / ref) * len;
    if (lossAtTop > MAX_LINE_LOSS_DB) {
      throw new StageParameterError(
        'lossDbPerM',
        `the line would lose ${formatNumber(lossAtTop)} dB at ${formatQuantity(top, 'hertz')} ` +
          `(${formatNumber(loss)} dB/m at ${formatQuantity(ref, 'hertz')}, scaled with √f, ` +
          `over ${formatQuantity(len, 'metre')}), more than the ${MAX_LINE_LOSS_DB} dB the ` +
          `analysis takes; check the loss per metre and its reference frequency`,
      );
    }
    const alphaRef = loss / DB_PER_NEPER; // Np/m at ref
    const delay = len / (vf * SPEED_OF_LIGHT);
    return {
      sections: [
        {
          abcd(f, out, o) {
            transmissionLineAbcd(
              alphaRef * Math.sqrt(f / ref) * len,
              2 * Math.PI * f * delay,
              z0,
              out,
              o,
            );
          },
          // The block form: the point form's arithmetic at each point, without a call per
          // point through the node analysis's wrapper for point forms (nor a boxed frequency).
          fill(f, fo, n, out, oo) {
            for (let k = 0; k < n; k++) {
              const fk = f[fo + k];
              transmissionLineAbcd(
                alphaRef * Math.sqrt(fk / ref) * len,
                2 * Math.PI * fk * delay,
                z0,
                out,
                oo + 8 * k,
              );
            }
          },
        },
      ],
      noise: { kind: 'passive' },
      // ngspice's lossless line is exact; the √f loss has no exact SPICE element.
      spice:
        loss === 0
          ? (inNode, outNode, prefix) => {
              if (len === 0) {
                const w = new SpiceWriter(prefix);
                w.wire(inNode, outNode);
                return w.lines;
              }
              return [
                `T${prefix}_1 ${inNode} 0 ${outNode} 0 Z0=${spiceNum(z0)} TD=${spiceNum(delay)}`,
              ];
            }
          : undefined,
    };
  },
};

const SWITCH_PARAMS = [
  numParam('insertionLossDb', 'Insertion loss', 'db', 0.5, { min: 0, max: 20 }),
  numParam('isolationDb', 'Isolation', 'db', 40, { min: 0, max: 120 }),
  enumParam('state', 'State', [
    ['receive', 'Receive (path connected)'],
    ['transmit', 'Transmit (receiver isolated)'],
  ]),
  numParam('z0', 'System impedance', 'ohm', 50, { min: 0, exclusiveMin: true }),
];

/**
 * Transmit/receive switch in the receive path, modelled as a matched resistive pad at z0:
 * its insertion loss while receiving, its isolation while transmitting.
 */
export const TR_SWITCH: StageDefinition = {
  type: 'tr-switch',
  category: 'element',
  role: 'two-port',
  label: 'T/R switch',
  summary: 'Connects the antenna to the receiver or, while transmitting, isolates the receiver.',
  params: SWITCH_PARAMS,
  cautions: ['transmit', 'rf-exposure'],
  build(values) {
    const p = readParams(SWITCH_PARAMS, values);
    const db = p.str('state') === 'transmit' ? p.num('isolationDb') : p.num('insertionLossDb');
    if (db === 0) {
      return {
        sections: [{ abcd: (_f, out, o) => setAbcd(out, o, 1, 0, 0, 0, 0, 0, 1, 0) }],
        noise: { kind: 'passive' },
        spice: (inNode, outNode, prefix) => {
          const w = new SpiceWriter(prefix);
          w.wire(inNode, outNode);
          return w.lines;
        },
      };
    }
    const elements = padElements(db, p.num('z0'), 'pi');
    return {
      sections: ladderSections(elements),
      noise: { kind: 'passive' },
      spice: ladderSpice(elements),
    };
  },
};
