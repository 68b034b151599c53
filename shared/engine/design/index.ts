/**
 * Design helpers: matching synthesis, preferred values, coil winding.
 */
import {
  designDoubleL,
  designLSection,
  designPi,
  designT,
  type MatchDesign,
  type MatchKind,
  type MatchSpec,
} from './match-design';
import { designTappedCapacitor } from './tapped-capacitor';

export * from './l-section';
export * from './match-design';
export * from './tapped-capacitor';
export * from './preferred-values';
export * from './wheeler-coil';

/**
 * One entry point for every matching topology. Component values come back in SI units,
 * keyed as the matching stages' values mode names them.
 * @throws StageParameterError naming the input to change when the match is impossible.
 */
export function designMatch(kind: MatchKind, spec: MatchSpec): MatchDesign {
  switch (kind) {
    case 'l-lowpass':
      return designLSection(spec, 'lowpass');
    case 'l-highpass':
      return designLSection(spec, 'highpass');
    case 'pi':
      return designPi(spec);
    case 't':
      return designT(spec);
    case 'double-l':
      return designDoubleL(spec);
    case 'tapped-c':
      return designTappedCapacitor(spec);
  }
}
export * from './chain-edit';
export * from './complex-match';
export * from './match-here';
export * from './match-stages';
export * from './snap-chain';
export * from './coil-parts';
export * from './coil-winding';
export * from './tune';
export * from './tune-pair';
