/**
 * Contracts of what the engine answers: the analysis result and its reports (nodes, stages,
 * resonators, selectivity, levels, flags, sweep). Re-exported by `types.ts`.
 */
import type { PlanReport } from './planning/plan';
import type { TransmitReport, TrapReport } from './transmit';

export interface ComplexJson {
  re: number;
  im: number;
}

export type Severity = 'info' | 'warning' | 'error';

export type FlagCode =
  | 'tank-overloaded'
  | 'tank-detuned'
  | 'no-resonance'
  | 'match-missed'
  | 'compression'
  | 'detector-underdriven'
  | 'q-budget'
  | 'spur-response'
  | 'blocking'
  | 'converter-floor'
  | 'converter-clips'
  | 'noise-mismatch'
  | 'implausible-value'
  | 'tank-matched'
  | 'caution'
  | 'trap-missed'
  | 'harmonics-high'
  | 'receiver-overdriven'
  | 'part-stress';

export interface Flag {
  code: FlagCode;
  severity: Severity;
  /** Id of the stage the flag concerns. */
  stageId: string;
  /** One sentence with the numbers a designer needs. */
  message: string;
  /** The numbers, for tables and tests. */
  data?: Record<string, number | string>;
}

/** Everything at one user-level node (a stage boundary) at f0. Node 0 = source terminal. */
export interface NodeReport {
  index: number;
  /** Label of the stage that ends at this node ("Source" for node 0). */
  after: string;
  /** Input impedance looking toward the load. */
  zIn: ComplexJson;
  /** Impedance looking back toward the source. */
  zSrc: ComplexJson;
  /** Node voltage, PEAK volts, and its rms. */
  vPeak: number;
  vRms: number;
  phaseDeg: number;
  /** |V|/|Es| (voltage step-up relative to the source EMF) and in dB. */
  stepUp: number;
  stepUpDb: number;
  deliveredW: number;
  availableW: number;
  deliveredDbm: number;
  availableDbm: number;
  /** Transducer gain from the source to this node, dB. */
  transducerGainDb: number;
  /** Mismatch factor 4·Rs·Rl/|Zs+Zl|² and its loss in dB. */
  mismatch: number;
  mismatchLossDb: number;
  /**
   * Return loss of Zin against the impedance looking back (|Zin − Zsrc*|/|Zin + Zsrc|), dB:
   * the match between the two sides that are really there.
   */
  matchReturnLossDb: number;
  /**
   * Reference resistance the user chose for this node (chain-wide or for this port), ohm;
   * null when none was chosen.
   */
  referenceOhm: number | null;
  /** Return loss and VSWR of Zin against `referenceOhm`; null when no reference was chosen. */
  returnLossDb: number | null;
  vswr: number | null;
  /** The node's rms voltage as dBm across `referenceOhm` (V²/R); null without a reference. */
  referenceLevelDbm: number | null;
}

/** One stage (two-port) between node k and node k+1, at f0. */
export interface StageReport {
  id: string;
  type: string;
  label: string;
  fromNode: number;
  toNode: number;
  /** Frequency at the stage's input and output, Hz. */
  fInHz: number;
  fOutHz: number;
  voltageGainDb: number;
  cumulativeVoltageGainDb: number;
  availableGainDb: number;
  transducerGainDb: number;
  noiseFigureDb: number;
  cumulativeNoiseFigureDb: number;
  /** Effective input noise temperature Te = T0·(F − 1), K: the stage's own and cumulative. */
  noiseTemperatureK: number;
  cumulativeNoiseTemperatureK: number;
  /**
   * Noise at the stage's output as an available-noise temperature, K:
   * G_cumulative·(T_source + Te_cumulative).
   */
  outputNoiseTemperatureK: number;
  cumulativeGainDb: number;
  iip3Dbm: number | null;
  cumulativeIip3Dbm: number | null;
  p1dbDbm: number | null;
  cumulativeP1dbDbm: number | null;
  /** Signal level at the stage input, dBm available. */
  inputLevelDbm: number;
  /**
   * A matching network entered by design: the part values the design chose (SI), keyed
   * like the stage's value parameters (optional; absent for every other stage).
   */
  designedValues?: Record<string, number>;
}

export interface ResonatorReport {
  stageId: string;
  label: string;
  kind: 'shunt' | 'series';
  /**
   * User-level node index (shunt tanks at a stage boundary); null for series resonators and
   * for tanks at a node inside a stage.
   */
  node: number | null;
  resonanceHz: number | null;
  loadedQ: number | null;
  unloadedQ: number | null;
  bandwidthHz: number | null;
  /** Q and bandwidth with the downstream side removed (shunt tanks). */
  detachedQ: number | null;
  detachedBandwidthHz: number | null;
  /** Q_attached / Q_detached. */
  loadingRatio: number | null;
  /** Share of the tank's damping taken by the downstream side at fr. */
  downstreamShare: number | null;
  /**
   * 'declared' by its stage, or 'found' from the network at a node (optional; older results
   * hold declared resonators only).
   */
  origin?: 'declared' | 'found';
  /** Ids of the stages whose parts make up a found tuned circuit (optional). */
  partOf?: string[];
  /**
   * A coupled pair: where the pair's response really peaks (the voltage maximum at its
   * output node, input frequency), Hz, and its −3 dB width there (optional).
   */
  pairPeakHz?: number | null;
  pairBandwidthHz?: number | null;
}

export interface SelectivityReport {
  node: number;
  peakHz: number | null;
  peakStepUpDb: number | null;
  bw3dbHz: number | null;
  /** Lower and upper half-power (−3 dB) edges, Hz (optional; null when not reached). */
  bw3dbLowHz?: number | null;
  bw3dbHighHz?: number | null;
  /**
   * −60 dB width; null when the response does not fall through −60 dB with a margin on both
   * sides within the sweep (see depthDb).
   */
  bw60dbHz: number | null;
  /**
   * How far below the peak the response falls on its shallower side within the sweep, dB
   * (optional): "floor at −60.0 dB" where a filter's ultimate rejection stops it there.
   */
  depthDb?: number | null;
  shapeFactor: number | null;
  /** Attenuation relative to the peak at each stated offset (+ and − side), dB. */
  offsets: { offsetHz: number; belowDb: number | null; aboveDb: number | null }[];
  imageHz: number | null;
  imageRejectionDb: number | null;
}

export interface LevelsReport {
  noiseFloorDbm: number;
  noiseFigureDb: number;
  /** Effective input noise temperature of the whole chain, T0·(F − 1), K. */
  noiseTemperatureK: number;
  /** Noise temperature of the source (antenna) taken for the system figure, K. */
  sourceNoiseTemperatureK: number;
  /** System noise temperature referred to the antenna terminals, T_source + Te, K. */
  systemNoiseTemperatureK: number;
  /**
   * The same noise figure by the noise-correlation-matrix method (Hillbrand and Russer), a
   * cross-check of the Friis cascade (optional).
   */
  correlationNoiseFigureDb?: number;
  totalGainDb: number;
  sensitivityDbm: number;
  /** Sensitivity as PEAK and rms EMF at the source, volts. */
  sensitivityEmfRms: number;
  iip3Dbm: number | null;
  sfdrDb: number | null;
  inputAvailableDbm: number;
}

export interface SweepReport {
  freqsHz: number[];
  /** Per node: step-up in dB and phase of the node voltage, degrees. */
  nodes: { index: number; stepUpDb: number[]; phaseDeg: number[] }[];
  zIn: { re: number[]; im: number[] };
  returnLossDb: number[];
}

export interface AnalysisResult {
  engineVersion: string;
  f0Hz: number;
  nodes: NodeReport[];
  stages: StageReport[];
  resonators: ResonatorReport[];
  selectivity: SelectivityReport[];
  levels: LevelsReport;
  flags: Flag[];
  sweep?: SweepReport;
  /** The receiver plan (spurs, strong signals, outside noise, converter), when asked for. */
  plan?: PlanReport;
  /** The mode analysed, when the chain has modes. */
  mode?: { id: string; name: string; kind: 'receive' | 'transmit' | 'state' };
  /**
   * Cautions about the chain as a whole (a chain with a transmit mode carries the `transmit`
   * caution in every mode), each with its text.
   */
  cautions?: { caution: 'high-voltage' | 'transmit' | 'rf-exposure'; message: string }[];
  /** Branches to ground judged at f0 (present when the chain has any). */
  traps?: TrapReport[];
  /** The transmit analysis (present in a transmit mode). */
  transmit?: TransmitReport;
}
