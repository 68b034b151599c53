/**
 * RF input resistance of a diode envelope (peak) detector at a given drive level.
 *
 * A diode i = Is·(exp(v/(n·VT)) − 1) feeds a load RL across a reservoir capacitor large
 * enough to hold the output at a steady Vo. Driven by V·cos θ, the diode current is
 * Is·(exp((V·cos θ − Vo)/(n·VT)) − 1), whose mean and fundamental follow from
 * exp(x·cos θ) = I0(x) + 2·Σ Ik(x)·cos kθ with x = V/(n·VT):
 * - DC balance: Is·(I0(x)·e^(−Vo/(n·VT)) − 1) = Vo/RL;
 * - fundamental current amplitude I1 = 2·Is·I1(x)·e^(−Vo/(n·VT)), and Rin = V/I1.
 * This is the classical Bessel-function analysis of the diode detector (e.g. H. C. Torrey and
 * C. A. Whitmer, "Crystal Rectifiers", 1948; from memory). Its limits: Rin → n·VT/Is at low
 * drive (the diode's zero-bias resistance) and Rin → RL/2 at strong drive (the usual
 * large-signal rule).
 */

/** Elementary charge over Boltzmann's constant, K/V: VT = T·k/q. */
const K_OVER_Q = 1.380649e-23 / 1.602176634e-19;

/** Thermal voltage kT/q at temperature T (K), volts. */
export function thermalVoltage(temperatureK: number): number {
  return K_OVER_Q * temperatureK;
}

/**
 * ln I0(x) and ln I1(x) for x ≥ 0 from the polynomial approximations of Abramowitz and
 * Stegun, "Handbook of Mathematical Functions", 9.8.1–9.8.4 (relative error below about
 * 2e-7); the logarithms keep large drives (x in the thousands) from overflowing.
 */
export function logBesselI01(x: number): { lnI0: number; lnI1: number } {
  if (x <= 3.75) {
    const t = (x / 3.75) ** 2;
    const i0 =
      1 +
      t * (3.5156229 + t * (3.0899424 + t * (1.2067492 + t * (0.2659732 + t * (0.0360768 + t * 0.0045813))))); // prettier-ignore
    const i1x =
      0.5 +
      t * (0.87890594 + t * (0.51498869 + t * (0.15084934 + t * (0.02658733 + t * (0.00301532 + t * 0.00032411))))); // prettier-ignore
    return { lnI0: Math.log(i0), lnI1: x > 0 ? Math.log(x * i1x) : -Infinity };
  }
  const u = 3.75 / x;
  const p0 =
    0.39894228 +
    u * (0.01328592 + u * (0.00225319 + u * (-0.00157565 + u * (0.00916281 + u * (-0.02057706 + u * (0.02635537 + u * (-0.01647633 + u * 0.00392377))))))); // prettier-ignore
  const p1 =
    0.39894228 +
    u * (-0.03988024 + u * (-0.00362018 + u * (0.00163801 + u * (-0.01031555 + u * (0.02282967 + u * (-0.02895312 + u * (0.01787654 + u * -0.00420059))))))); // prettier-ignore
  const base = x - 0.5 * Math.log(x);
  return { lnI0: base + Math.log(p0), lnI1: base + Math.log(p1) };
}

export interface DiodeDetectorParts {
  /** Detector load resistance (across the reservoir capacitor), ohm. */
  rLoad: number;
  /** Diode saturation current, A. */
  is: number;
  /** Diode ideality factor. */
  n: number;
  temperatureK: number;
}

/** The detector's DC output Vo (V) for a peak drive V, from the DC balance (bisection). */
export function detectorOutput(vPeak: number, d: DiodeDetectorParts): number {
  const nvt = d.n * thermalVoltage(d.temperatureK);
  const { lnI0 } = logBesselI01(vPeak / nvt);
  // h(Vo) = Is·(I0(x)·e^(−Vo/nVT) − 1) − Vo/RL falls monotonically from h(0) ≥ 0.
  const h = (vo: number) => d.is * (Math.exp(lnI0 - vo / nvt) - 1) - vo / d.rLoad;
  let lo = 0;
  let hi = vPeak;
  if (!(h(lo) > 0)) return 0;
  for (let k = 0; k < 200 && hi - lo > 1e-15 * Math.max(hi, 1e-300); k++) {
    const mid = 0.5 * (lo + hi);
    if (h(mid) > 0) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** RF input resistance (ohm) of the detector driven at `vPeak` volts. */
export function detectorInputResistance(vPeak: number, d: DiodeDetectorParts): number {
  const nvt = d.n * thermalVoltage(d.temperatureK);
  const x = vPeak / nvt;
  if (!(x > 1e-9)) return nvt / d.is; // zero-bias resistance: the small-signal limit
  const vo = detectorOutput(vPeak, d);
  const { lnI1 } = logBesselI01(x);
  // Rin = V / (2·Is·I1(x)·e^(−Vo/nVT)), in logarithms.
  return Math.exp(Math.log(vPeak) - Math.log(2 * d.is) - lnI1 + vo / nvt);
}
