/**
 * Winding an air-core single-layer coil for a wanted inductance (Wheeler 1928). Two ways to
 * state the coil form: a winding length (turns spread over it), or the wire diameter and the
 * pitch (turns spaced by the pitch, so the length grows with the turns). In the second case
 * Wheeler's formula L = d²n²/(18d + 40np) (inches, µH) is a quadratic in n:
 * d²n² − 40·L·p·n − 18·L·d = 0. The diameter in Wheeler's formula is that of the turns'
 * centres: the former's diameter plus one wire diameter. Imports nothing but the formula,
 * so the client can use it without the rest of the engine.
 */
import { wheelerInductance, wheelerTurns } from './wheeler-coil';

const METRES_PER_INCH = 0.0254;

/** The coil form a user states. Lengths in metres. */
export type CoilForm =
  | { formerDiameterM: number; lengthM: number }
  | { formerDiameterM: number; wireDiameterM: number; pitchM: number };

export interface CoilWinding {
  /** Turns, unrounded, and rounded to the nearest quarter turn. */
  turns: number;
  roundedTurns: number;
  /** Winding length, m. */
  lengthM: number;
  /** Diameter used in the formula (turn centres), m. */
  coilDiameterM: number;
  /** Inductance of the rounded turns, H. */
  roundedInductanceH: number;
  /** Wheeler's formula holds to about 1 % when the length exceeds 0.4 diameters. */
  withinAccuracy: boolean;
}

/** A common former for shortwave and broadcast coils: 20 mm, 0.5 mm wire at 1 mm pitch. */
export const DEFAULT_COIL_FORM: CoilForm = {
  formerDiameterM: 0.02,
  wireDiameterM: 0.0005,
  pitchM: 0.001,
};

function checkForm(form: CoilForm): void {
  const values = Object.values(form) as number[];
  if (!values.every((v) => v > 0 && Number.isFinite(v))) {
    throw new RangeError('coil form: every dimension must be above 0 m');
  }
  if ('pitchM' in form && form.pitchM < form.wireDiameterM) {
    throw new RangeError(
      `coil form: the pitch (${form.pitchM} m) cannot be less than the wire diameter (${form.wireDiameterM} m)`,
    );
  }
}

/** Turns for a wanted inductance (H) on a stated coil form (Wheeler 1928). */
export function coilWinding(inductanceH: number, form: CoilForm): CoilWinding {
  checkForm(form);
  if (!(inductanceH > 0)) {
    throw new RangeError(`coil: inductance must be above 0 H (got ${inductanceH})`);
  }
  let coilDiameterM: number;
  let turns: number;
  let lengthOf: (n: number) => number;
  if ('lengthM' in form) {
    coilDiameterM = form.formerDiameterM;
    turns = wheelerTurns(inductanceH, coilDiameterM, form.lengthM);
    lengthOf = () => form.lengthM;
  } else {
    coilDiameterM = form.formerDiameterM + form.wireDiameterM;
    const d = coilDiameterM / METRES_PER_INCH;
    const p = form.pitchM / METRES_PER_INCH;
    const l = inductanceH * 1e6;
    turns = (40 * l * p + Math.sqrt((40 * l * p) ** 2 + 72 * l * d ** 3)) / (2 * d * d);
    lengthOf = (n) => n * form.pitchM;
  }
  const roundedTurns = Math.max(0.25, Math.round(turns * 4) / 4);
  const lengthM = lengthOf(turns);
  return {
    turns,
    roundedTurns,
    lengthM,
    coilDiameterM,
    roundedInductanceH: wheelerInductance(roundedTurns, coilDiameterM, lengthOf(roundedTurns)),
    withinAccuracy: lengthM > 0.4 * coilDiameterM,
  };
}
