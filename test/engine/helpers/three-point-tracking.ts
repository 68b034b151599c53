/**
 * Three-point tracking of a superhet's oscillator to its signal circuit, worked in closed form
 * for tests. The rule (Terman, "Radio Engineers' Handbook", 1943, the superheterodyne
 * tracking section; Langford-Smith, "Radiotron Designer's Handbook", 4th ed., ch. 25): with a
 * padder in series and a trimmer across the oscillator's gang section, choose the coil, the
 * trimmer and the padder so that fLO = fRF + fIF holds exactly at three dial settings,
 * conventionally near both ends and the middle of the band (from memory: at the centre and
 * ±(√3/2) of the half-band from it). Between them the error swings through zero three times.
 */
const TWO_PI = 2 * Math.PI;

export interface SignalCircuit {
  /** Signal coil, H. */
  l: number;
  /** Trimmer across the signal section, F. */
  trimmer: number;
}

/** The gang section's value that tunes the signal circuit to f. */
export const sectionFor = (f: number, rf: SignalCircuit) =>
  1 / ((TWO_PI * f) ** 2 * rf.l) - rf.trimmer;

/** Signal circuit's resonance at a section value. */
export const signalHz = (section: number, rf: SignalCircuit) =>
  1 / (TWO_PI * Math.sqrt(rf.l * (section + rf.trimmer)));

/** Oscillator resonance: (section + trimmer) in series with the padder, across the coil. */
export const oscHz = (section: number, o: { l: number; trimmer: number; padder: number }) => {
  const c = section + o.trimmer;
  return 1 / (TWO_PI * Math.sqrt((o.l * (c * o.padder)) / (c + o.padder)));
};

/**
 * Solves coil, trimmer and padder of the oscillator for exact tracking at f1 < f2 < f3.
 * With L·ω² = 1/(x + t) + 1/p at each point (x the section value, ω = 2π(f + fIF)), the
 * differences between points remove p and the ratio of two removes L, leaving one equation
 * in t, solved by bisection.
 */
export function threePointDesign(
  rf: SignalCircuit,
  ifHz: number,
  points: [number, number, number],
): { l: number; trimmer: number; padder: number } {
  const x = points.map((f) => sectionFor(f, rf));
  const w2 = points.map((f) => (TWO_PI * (f + ifHz)) ** 2);
  const lFrom = (t: number, a: number, b: number) =>
    (1 / (x[a] + t) - 1 / (x[b] + t)) / (w2[a] - w2[b]);
  const g = (t: number) => lFrom(t, 0, 1) - lFrom(t, 1, 2);
  let lo = 0;
  let hi = 1e-9;
  if (Math.sign(g(lo)) === Math.sign(g(hi)))
    throw new Error('no trimmer in 0…1 nF tracks these points');
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi);
    if (Math.sign(g(mid)) === Math.sign(g(lo))) lo = mid;
    else hi = mid;
  }
  const t = 0.5 * (lo + hi);
  const l = lFrom(t, 0, 1);
  const padder = 1 / (l * w2[1] - 1 / (x[1] + t));
  return { l, trimmer: t, padder };
}
