/** Branches to ground judged as traps, and the transmit analysis of a transmit mode. */
export { analyseTransmit, type HarmonicReport, type PartStressReport, type TransmitReport } from './analyse-transmit'; // prettier-ignore
export { isTrapResonance, judgeTraps, trapFlags, type TrapReport } from './traps';
